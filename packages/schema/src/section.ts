import { z } from 'zod';
import { GRADES } from '@platesmith/catalogue';
import { LIMITS } from './limits.js';

/** A plate dimension in mm: finite, positive, and plausible for a girder plate. */
export const mm = (what: string, max = 100_000, min = 0) =>
  z
    .number({ error: `${what} must be a number of mm` })
    .refine(Number.isFinite, { message: `${what} must be finite` })
    .refine((v) => v > 0, { message: `${what} must be positive (mm)` })
    .refine((v) => v >= min, { message: `${what} under ${min} mm is not a girder's; lengths are in mm` })
    .refine((v) => v <= max, { message: `${what} over ${max} mm is not a girder plate; lengths are in mm` })
    .meta({ description: `${what}, mm` });

export const Grade = z.enum(GRADES as unknown as [string, ...string[]], { error: (i) => `unknown steel grade ${JSON.stringify(i.input)}: the grades are ${GRADES.join(', ')}` }).meta({
  description: 'steel grade (EN 10025-2: S235, S275, S355; EN 10025-4: S420, S460)',
});

// least plate dimensions: nothing thinner than 1 mm or narrower than 10 mm is a girder's plate (common practice, no source)
export const Plate = (what: string) =>
  z.strictObject({
    width: mm(`${what} width`, 3000, 10),
    thickness: mm(`${what} thickness`, 150, 1),
  });

export const Web = z.strictObject({
  depth: mm('web depth hw (clear, between flanges)', 10_000, 100),
  thickness: mm('web thickness tw', 150, 1),
});

export const Stiffeners = z
  .strictObject({
    spacing: mm('stiffener spacing a', LIMITS.spanMm, LIMITS.stiffenerSpacingMm),
    width: mm('stiffener flat outstand bs', 1000, 10),
    thickness: mm('stiffener flat thickness ts', 150, 1),
    sides: z.union([z.literal(1), z.literal(2)]).default(2).meta({ description: 'flats on one or both faces of the web' }),
  })
  .meta({ description: 'intermediate transverse stiffeners (full web depth)' });

export const Bearing = z
  .strictObject({
    width: mm('bearing stiffener outstand', 1000, 10),
    thickness: mm('bearing stiffener thickness', 150, 1),
    spacing: mm('distance e between the two pairs of a rigid end post', 5000, 10).optional(),
    pairs: z
      .number({ error: 'bearing stiffener pairs must be a whole number' })
      .int({ message: 'bearing stiffener pairs must be a whole number' })
      .min(1, { message: 'bearing stiffener pairs: at least 1' })
      .max(LIMITS.bearingPairs, { message: `bearing stiffener pairs: at most ${LIMITS.bearingPairs} over one support` })
      .optional()
      .meta({ description: 'double-sided pairs side by side over each support, acting as one column (EN 1993-1-5 9.4); default 1. A rigid end post adds one outer pair `spacing` from the end' }),
  })
  .meta({ description: 'bearing stiffeners at supports (double-sided); when not given, sized by the tool: one pair of stock flats, else flats or plates of the plate stock in 1 to 3 pairs' });

export const LoadStiffeners = z
  .strictObject({
    width: mm('load-bearing stiffener outstand bs', 1000, 10),
    thickness: mm('load-bearing stiffener thickness ts', 150, 1),
    at: z
      .array(z.number().refine(Number.isFinite, { message: 'load-bearing stiffener positions must be finite (mm)' }).refine((v) => v >= 0 && v <= LIMITS.lengthMm, { message: `load-bearing stiffener positions are 0 … ${LIMITS.lengthMm} mm` }))
      .max(LIMITS.actions)
      .optional()
      .meta({ description: 'positions, mm from the left end; default: under every concentrated force (answers give the positions used)' }),
  })
  .meta({ description: 'load-bearing stiffeners under concentrated forces (EN 1993-1-5 9.4): a double-sided pair of flats, fitted to the loaded flange, at each position; they carry the force instead of the web (no patch loading there) and are panel boundaries' });

export const RestraintStiffeners = z
  .strictObject({
    width: mm('restraint stiffener outstand bs', 1000, 10),
    thickness: mm('restraint stiffener thickness ts', 150, 1),
    at: z
      .array(z.number().refine(Number.isFinite, { message: 'restraint stiffener positions must be finite (mm)' }).refine((v) => v >= 0 && v <= LIMITS.lengthMm, { message: `restraint stiffener positions are 0 … ${LIMITS.lengthMm} mm` }))
      .max(LIMITS.restraints)
      .optional()
      .meta({ description: 'positions, mm from the left end; default: at every lateral restraint of options.restraint and options.bottomRestraint inside the girder' }),
  })
  .meta({ description: 'stiffeners where a lateral restraint (cross-frame, bracing) attaches: a double-sided pair of flats at each position, carrying the restraint force (EN 1993-1-1 5.3.3)' });

export const GradeSpec = z.union(
  [Grade, z.strictObject({ web: Grade, flanges: Grade, stiffeners: Grade.optional() }).meta({ description: 'hybrid girder: web and flange grades' })],
  {
    error: (i) =>
      typeof i.input === 'string'
        ? `unknown steel grade ${JSON.stringify(i.input)}: the grades are ${GRADES.join(', ')}`
        : `a grade is one of ${GRADES.join(', ')}, or { "web", "flanges", "stiffeners" } of those for a hybrid girder`,
  },
);

export const SectionJson = z
  .strictObject({
    web: Web,
    topFlange: Plate('top flange'),
    bottomFlange: Plate('bottom flange'),
    stiffeners: Stiffeners.nullable().optional().meta({ description: 'intermediate transverse stiffeners; default none (null)' }),
    endPost: z.enum(['rigid', 'non-rigid']).optional().meta({ description: 'EN 1993-1-5 5.3 / 9.3.1 end-post type; default rigid' }),
    bearing: Bearing.optional(),
    loadStiffeners: LoadStiffeners.nullable().optional().meta({ description: 'load-bearing stiffeners under concentrated forces; default none (null): forces enter the web unstiffened' }),
    restraintStiffeners: RestraintStiffeners.nullable().optional().meta({ description: 'stiffeners at lateral restraints; default none (null)' }),
    grade: GradeSpec.optional().meta({ description: 'default S355' }),
  })
  .meta({ id: 'Section', description: 'welded I-girder section; all dimensions mm' });

export type SectionJson = z.output<typeof SectionJson>;
