import { z } from 'zod';

const positive = (what: string) =>
  z.number({ error: `${what} must be a number` }).refine(Number.isFinite, { message: `${what} must be finite` }).refine((v) => v > 0, { message: `${what} must be positive` });

export const FactorsJson = z.union([
  z.enum(['buildings', 'bridges']).meta({ description: 'buildings: γM0 = γM1 = 1.0, γM2 = 1.25; bridges (EN 1993-2): γM1 = 1.1' }),
  z.strictObject({ gammaM0: positive('gammaM0'), gammaM1: positive('gammaM1'), gammaM2: positive('gammaM2') }),
]);

export const RestraintJson = z.union([
  z.literal('continuous').meta({ description: 'flange restrained continuously against lateral movement: no lateral-torsional buckling check for the sign that compresses it' }),
  z.literal('supports').meta({ description: 'restrained at the supports only' }),
  z.strictObject({ spacing: positive('restraint spacing').meta({ description: 'equal restraint spacing, mm' }) }),
  z.strictObject({ at: z.array(z.number().refine(Number.isFinite)).min(1).meta({ description: 'restraint positions from the left end, mm' }) }),
]);

export const CheckOptionsJson = z
  .strictObject({
    factors: FactorsJson.default('buildings'),
    eta: positive('eta').refine((v) => v <= 1.2, { message: 'eta is at most 1.2 (EN 1993-1-5 5.1(2))' }).default(1.2),
    fySource: z.enum(['product', 'table3.1']).default('product').meta({ description: 'fy by the product standard bands (default) or EN 1993-1-1 Table 3.1' }),
    kFib: z.union([z.literal('auto'), z.literal(0.3), z.literal(0.4), z.literal(0.55)]).default('auto').meta({ description: 'EN 1993-1-5 8(1) k' }),
    restraint: RestraintJson.default('continuous').meta({ description: 'lateral restraint of the top flange (in compression under sagging): continuous, supports, equal spacing or positions (mm)' }),
    bottomRestraint: RestraintJson.default('supports').meta({ description: 'lateral restraint of the bottom flange (in compression under hogging); default: at the supports only' }),
    loadHeight: z.enum(['top-flange', 'shear-centre', 'bottom-flange']).default('top-flange'),
    ltbMethod: z.enum(['general', 'rolled-equivalent']).default('general').meta({ description: 'EN 1993-1-1 6.3.2.2 or 6.3.2.3' }),
    ltbModification: z.boolean().default(false).meta({ description: 'EN 1993-1-1 6.3.2.3(2) factor f' }),
    weldThroats: z.array(positive('weld throat')).min(1).optional().meta({ description: 'fillet throat sizes a to choose from, mm' }),
    supportBearingLength: positive('supportBearingLength').default(100).meta({ description: 'stiff bearing length at supports, mm' }),
    snipe: z.number().min(0).default(20).meta({ description: 'corner snipe of stiffeners, mm' }),
  })
  .meta({ id: 'CheckOptions' });

export type CheckOptionsJson = z.output<typeof CheckOptionsJson>;
