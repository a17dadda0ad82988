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

export const CheckOptionsJson = z
  .strictObject({
    factors: FactorsJson.default('buildings'),
    eta: positive('eta', 1.2).refine((v) => v <= 1.2, { message: 'eta is at most 1.2 (EN 1993-1-5 5.1(2))' }).default(1.2),
    fySource: z.enum(['product', 'table3.1']).default('product').meta({ description: 'fy by the product standard bands (default) or EN 1993-1-1 Table 3.1' }),
    kFib: z.union([z.literal('auto'), z.literal(0.3), z.literal(0.4), z.literal(0.55)]).default('auto').meta({ description: 'EN 1993-1-5 8(1) k' }),
    restraint: RestraintJson.default('continuous').meta({ description: 'lateral restraint of the top flange (in compression under sagging): continuous, supports, equal spacing or positions (mm)' }),
    bottomRestraint: RestraintJson.default('supports').meta({ description: 'lateral restraint of the bottom flange (in compression under hogging); default: at the supports only' }),
    loadHeight: z.enum(['top-flange', 'shear-centre', 'bottom-flange']).default('top-flange'),
    ltbMethod: z.enum(['general', 'rolled-equivalent']).default('general').meta({ description: 'EN 1993-1-1 6.3.2.2 or 6.3.2.3' }),
    ltbModification: z.boolean().default(false).meta({ description: 'EN 1993-1-1 6.3.2.3(2) factor f' }),
    weldThroats: z.array(positive('weld throat', 50)).min(1).max(20).optional().meta({ description: 'fillet throat sizes a to choose from, mm' }),
    supportBearingLength: positive('supportBearingLength', LIMITS.bearingLengthMm).default(100).meta({ description: 'stiff bearing length at supports, mm' }),
    snipe: bounded('snipe', 'mm', 0, 500).default(20).meta({ description: 'corner snipe of stiffeners, mm' }),
  })
  .meta({ id: 'CheckOptions' });

export type CheckOptionsJson = z.output<typeof CheckOptionsJson>;
