import { z } from 'zod';
import { bounded, LIMITS } from './limits.js';

const positive = (what: string, max: number) =>
  z
    .number({ error: `${what} must be a number` })
    .refine(Number.isFinite, { message: `${what} must be finite` })
    .refine((v) => v > 0, { message: `${what} must be positive` })
    .refine((v) => v <= max, { message: `${what} must be at most ${max}` });

export const FactorsJson = z.union([
  z.enum(['buildings', 'bridges']).meta({ description: 'buildings: γM0 = γM1 = 1.0, γM2 = 1.25; bridges (EN 1993-2): γM1 = 1.1' }),
  z.strictObject({ gammaM0: positive('gammaM0', LIMITS.factor), gammaM1: positive('gammaM1', LIMITS.factor), gammaM2: positive('gammaM2', LIMITS.factor) }),
]);

export const RestraintJson = z.union([
  z.literal('continuous').meta({ description: 'flange restrained continuously against lateral movement: no lateral-torsional buckling check for the sign that compresses it' }),
  z.literal('supports').meta({ description: 'restrained at the supports only' }),
  z.strictObject({
    spacing: bounded('restraint spacing', 'mm', LIMITS.restraintSpacingMm, LIMITS.lengthMm).meta({ description: `equal restraint spacing, mm (at least ${LIMITS.restraintSpacingMm}; at most ${LIMITS.restraints} restraints over the girder)` }),
  }),
  z.strictObject({
    at: z
      .array(bounded('restraint position', 'mm', 0, LIMITS.lengthMm))
      .min(1)
      .max(LIMITS.restraints, { message: `at most ${LIMITS.restraints} restraint positions` })
      .meta({ description: 'restraint positions from the left end, mm' }),
  }),
]);

/**
 * Every field is optional: a field left out takes the default named in its description, applied
 * by resolveOptions (convert.ts), which lists each default it applied as an assumption of the
 * answer. No default removes or weakens a check: a flange whose restraint is not given is
 * restrained at the supports only.
 */
export const CheckOptionsJson = z
  .strictObject({
    factors: FactorsJson.optional().meta({ description: 'partial factors γM; default "buildings" (γM0 = γM1 = 1.0, γM2 = 1.25), not the bridge set' }),
    eta: positive('eta', 1.2).refine((v) => v <= 1.2, { message: 'eta is at most 1.2 (EN 1993-1-5 5.1(2))' }).optional().meta({ description: 'EN 1993-1-5 5.1(2) η; default 1.2' }),
    fySource: z.enum(['product', 'table3.1']).optional().meta({ description: 'fy by the product standard bands or EN 1993-1-1 Table 3.1; default product' }),
    kFib: z.union([z.literal('auto'), z.literal(0.3), z.literal(0.4), z.literal(0.55)]).optional().meta({ description: 'EN 1993-1-5 8(1) k; default auto' }),
    restraint: RestraintJson.optional().meta({ description: 'lateral restraint of the top flange (in compression under sagging): continuous, supports, equal spacing or positions (mm); default: at the supports only' }),
    bottomRestraint: RestraintJson.optional().meta({ description: 'lateral restraint of the bottom flange (in compression under hogging); default: at the supports only' }),
    loadHeight: z.enum(['top-flange', 'shear-centre', 'bottom-flange']).optional().meta({ description: 'where gravity loads act, for lateral-torsional buckling; default top-flange (destabilising)' }),
    ltbMethod: z.enum(['general', 'rolled-equivalent']).optional().meta({ description: 'EN 1993-1-1 6.3.2.2 or 6.3.2.3; default general' }),
    ltbModification: z.boolean().optional().meta({ description: 'EN 1993-1-1 6.3.2.3(2) factor f (kc = 1/√C1, C1 = Mcr/Mcr of uniform moment); default false' }),
    ltbEnds: z
      .strictObject({
        k: z.number().min(0.5).max(1).meta({ description: 'effective length factor for lateral bending, -' }),
        kw: z.number().min(0.5).max(1).meta({ description: 'effective length factor for warping, -' }),
      })
      .optional()
      .meta({ description: 'end conditions of each lateral-torsional buckling segment; default fork ends, k = kw = 1' }),
    weldThroats: z.array(positive('weld throat', 50)).min(1).max(20).optional().meta({ description: 'fillet throat sizes a to choose from, mm; default the catalogue range' }),
    supportBearingLength: positive('supportBearingLength', LIMITS.bearingLengthMm).optional().meta({ description: 'stiff bearing length at supports, mm; default 100' }),
    snipe: bounded('snipe', 'mm', 0, 500).optional().meta({ description: 'corner snipe of stiffeners, mm; default 20' }),
  })
  .meta({ id: 'CheckOptions' });

export type CheckOptionsJson = z.output<typeof CheckOptionsJson>;
