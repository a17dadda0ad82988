import { z } from 'zod';
import { bounded, LIMITS } from './limits.js';
import { Grade } from './section.js';

const count = (what: string) => `${what}: at most 1000 values`;

/** A list of values, or an arithmetic grid { min, max, step } (mm). */
export const GridJson = (what: string, max: number) =>
  z.union([
    z
      .array(z.number().refine(Number.isFinite, { message: `${what} values must be finite` }).refine((v) => v <= max, { message: `${what} values are at most ${max} mm` }))
      .min(1, { message: `${what} is empty` })
      .max(1000, { message: count(what) }),
    z
      .strictObject({ min: z.number(), max: z.number(), step: z.number() })
      .refine((g) => Number.isFinite(g.min) && Number.isFinite(g.max) && Number.isFinite(g.step), { message: `${what} grid must be finite numbers` })
      .refine((g) => Math.abs(g.min) <= max && Math.abs(g.max) <= max, { message: `${what} grid values are at most ${max} mm`, path: ['max'] })
      .refine((g) => g.step >= 0.01 || g.step <= 0, { message: `${what}.step is at least 0.01 mm`, path: ['step'] })
      .refine((g) => g.step > 0, { message: `${what}.step must be positive`, path: ['step'] })
      .refine((g) => g.max >= g.min, { message: `${what}.max must not be less than min`, path: ['max'] })
      .refine((g) => g.step <= 0 || (g.max - g.min) / g.step <= 1000, { message: count(what) }),
  ]).meta({ description: `${what}: a list, or { min, max, step }; mm. At most ${max} mm.` });

export const GradeListJson = z.union([Grade, z.array(Grade).min(1).max(5)]);

export const SpaceJson = z
  .strictObject({
    webDepth: GridJson('webDepth', 10_000).optional(),
    webThickness: GridJson('webThickness', 150).optional(),
    flangeWidth: GridJson('flangeWidth', 3000).optional(),
    flangeThickness: GridJson('flangeThickness', 150).optional(),
    symmetric: z.boolean().default(true).meta({ description: 'top and bottom flanges equal' }),
    panels: z
      .union([z.array(z.number().int().min(0).max(200)).min(1).max(200), z.strictObject({ min: z.number().int().min(0), max: z.number().int().max(200) })])
      .optional()
      .meta({ description: 'numbers of equal panels in the longest span; 0 = no intermediate stiffeners' }),
    flats: z.array(z.strictObject({ width: bounded('flat width', 'mm', Number.NEGATIVE_INFINITY, 1000), thickness: bounded('flat thickness', 'mm', Number.NEGATIVE_INFINITY, 150) })).max(100).optional().meta({ description: 'stiffener flats to try, mm (default: the catalogue stock)' }),
    stiffenerSides: z.union([z.literal(1), z.literal(2), z.literal('both')]).default(2),
    loadStiffeners: z
      .array(z.strictObject({ width: bounded('load-bearing stiffener flat width', 'mm', 10, 1000), thickness: bounded('load-bearing stiffener flat thickness', 'mm', 1, 150) }))
      .max(100)
      .optional()
      .meta({
        description:
          'load-bearing stiffeners (EN 1993-1-5 9.4) the search may place under the concentrated forces: a double-sided pair of one of these flats (mm) under every force, offered beside none. Default: none offered (the forces enter the web unstiffened, patch loading EN 1993-1-5 6, as before)',
      }),
    restraintStiffeners: z
      .strictObject({ width: bounded('restraint stiffener flat width', 'mm', 10, 1000), thickness: bounded('restraint stiffener flat thickness', 'mm', 1, 150) })
      .optional()
      .meta({ description: 'a double-sided pair of these flats (mm) on every candidate at each lateral restraint of either flange inside the girder (options.restraint, options.bottomRestraint), carrying the restraint force (EN 1993-1-1 5.3.3); default none' }),
    endPost: z.enum(['rigid', 'non-rigid', 'both']).default('both'),
    grade: z.union([GradeListJson, z.strictObject({ web: GradeListJson, flanges: GradeListJson })]).default('S355'),
    minDepth: bounded('minDepth', 'mm', 0, LIMITS.depthMm).optional().meta({ description: 'least overall depth h, mm' }),
    maxDepth: bounded('maxDepth', 'mm', Number.MIN_VALUE, LIMITS.depthMm).optional().meta({ description: 'greatest overall depth h = hw + tf,top + tf,bot, mm (clearance)' }),
    rules: z
      .strictObject({
        tfMaxOverTw: bounded('tfMaxOverTw', '-', Number.MIN_VALUE, LIMITS.ruleRatio).optional().meta({ description: 'tf ≤ k·tw' }),
        bfOverTfMin: bounded('bfOverTfMin', '-', Number.MIN_VALUE, LIMITS.ruleRatio).optional(),
        bfOverTfMax: bounded('bfOverTfMax', '-', Number.MIN_VALUE, LIMITS.ruleRatio).optional(),
        stiffenerAtLeastWeb: z.boolean().optional().meta({ description: 'stiffener flats at least as thick as the web (common practice)' }),
      })
      .default({}),
  })
  .superRefine((sp, ctx) => {
    if (sp.minDepth !== undefined && sp.maxDepth !== undefined && sp.minDepth > sp.maxDepth) {
      ctx.addIssue({ code: 'custom', path: ['minDepth'], message: `minDepth (${sp.minDepth} mm) is greater than maxDepth (${sp.maxDepth} mm): no girder has such a depth` });
    }
  })
  .meta({ id: 'Space', description: 'the discrete design space; every part has a default from the catalogue' });

export type SpaceJson = z.output<typeof SpaceJson>;

export const CostJson = z
  .strictObject({
    km: bounded('km', 'per kg', Number.MIN_VALUE, LIMITS.costRate).optional().meta({ description: 'material rate for S355 plate, per kg (illustrative default 1.0)' }),
    kfOverKm: z.number().min(0).max(10).optional().meta({ description: 'fabrication-to-material cost ratio kf/km, kg/min (published range 0–2; 0 = mass optimum)' }),
    gradeFactor: z
      .partialRecord(Grade, bounded('grade factor', '-', Number.MIN_VALUE, 100))
      .optional()
      .meta({ description: 'material rate of a grade relative to S355, - (grades not given keep the illustrative defaults: S235 0.95, S275 0.97, S355 1.0, S420 1.1, S460 1.15)' }),
    thetaD: bounded('thetaD', '-', Number.MIN_VALUE, 10).optional().meta({ description: 'assembly difficulty factor Θd (1–4)' }),
    flangeWeld: z.enum(['SAW', 'GMAW-C', 'SMAW']).optional(),
    stiffenerWeld: z.enum(['SAW', 'GMAW-C', 'SMAW']).optional(),
    painted: z.boolean().optional(),
  })
  .meta({ id: 'CostModel', description: 'Farkas–Jármai cost = km·mass + kf·Σ fabrication times; rates illustrative' });
