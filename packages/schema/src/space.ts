import { z } from 'zod';
import { Grade } from './section.js';

const count = (what: string) => `${what}: at most 1000 values`;

/** A list of values, or an arithmetic grid { min, max, step } (mm). */
export const GridJson = (what: string, max: number) =>
  z.union([
    z.array(z.number().refine(Number.isFinite, { message: `${what} values must be finite` })).min(1, { message: `${what} is empty` }).max(1000, { message: count(what) }),
    z
      .strictObject({ min: z.number(), max: z.number(), step: z.number() })
      .refine((g) => Number.isFinite(g.min) && Number.isFinite(g.max) && Number.isFinite(g.step), { message: `${what} grid must be finite numbers` })
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
    flats: z.array(z.strictObject({ width: z.number(), thickness: z.number() })).max(100).optional().meta({ description: 'stiffener flats to try, mm (default: the catalogue stock)' }),
    stiffenerSides: z.union([z.literal(1), z.literal(2), z.literal('both')]).default(2),
    endPost: z.enum(['rigid', 'non-rigid', 'both']).default('both'),
    grade: z.union([GradeListJson, z.strictObject({ web: GradeListJson, flanges: GradeListJson })]).default('S355'),
    minDepth: z.number().min(0).optional().meta({ description: 'least overall depth h, mm' }),
    maxDepth: z.number().positive().optional().meta({ description: 'greatest overall depth h = hw + tf,top + tf,bot, mm (clearance)' }),
    rules: z
      .strictObject({
        tfMaxOverTw: z.number().positive().optional().meta({ description: 'tf ≤ k·tw' }),
        bfOverTfMin: z.number().positive().optional(),
        bfOverTfMax: z.number().positive().optional(),
        stiffenerAtLeastWeb: z.boolean().optional().meta({ description: 'stiffener flats at least as thick as the web (common practice)' }),
      })
      .default({}),
  })
  .meta({ id: 'Space', description: 'the discrete design space; every part has a default from the catalogue' });

export type SpaceJson = z.output<typeof SpaceJson>;

export const CostJson = z
  .strictObject({
    km: z.number().positive().optional().meta({ description: 'material rate for S355 plate, per kg (illustrative default 1.0)' }),
    kfOverKm: z.number().min(0).max(10).optional().meta({ description: 'fabrication-to-material cost ratio kf/km, kg/min (published range 0–2; 0 = mass optimum)' }),
    gradeFactor: z
      .partialRecord(Grade, z.number().positive())
      .optional()
      .meta({ description: 'material rate of a grade relative to S355, - (grades not given keep the illustrative defaults: S235 0.95, S275 0.97, S355 1.0, S420 1.1, S460 1.15)' }),
    thetaD: z.number().positive().optional().meta({ description: 'assembly difficulty factor Θd (1–4)' }),
    flangeWeld: z.enum(['SAW', 'GMAW-C', 'SMAW']).optional(),
    stiffenerWeld: z.enum(['SAW', 'GMAW-C', 'SMAW']).optional(),
    painted: z.boolean().optional(),
  })
  .meta({ id: 'CostModel', description: 'Farkas–Jármai cost = km·mass + kf·Σ fabrication times; rates illustrative' });
