import { z } from 'zod';
import { GRADES, type GradeName } from '@platesmith/catalogue';
import { PublishedSearchJson, PublishedVerdictJson } from '@platesmith/schema';

/**
 * A girder schedule: shared defaults (problem, space and option fields of a search, e.g. the
 * grade, the combination, the space) and one entry per girder mark. Each entry is validated on
 * its own after the defaults are merged in, so one bad mark fails alone: the schedule schema only
 * checks the envelope (marks, quantities), the per-mark schemas are SearchInput and
 * CheckProblemInput of @platesmith/schema.
 */
export const GirderEntryJson = z
  .looseObject({
    mark: z.string().min(1).max(40).meta({ description: 'girder mark, e.g. "G1" (unique in the schedule)' }),
    quantity: z.number().int().min(1).max(100_000).meta({ description: 'number of girders of this mark, -' }),
    adopted: z
      .unknown()
      .optional()
      .meta({ description: 'the adopted section (Section schema, dimensions mm); when given, the mark is also checked as adopted' }),
  })
  .meta({
    id: 'ScheduleGirder',
    description:
      'one girder mark: mark, quantity, optional adopted section, and any problem fields of SearchInput (spans mm, actions kN/m or kN, envelope, options, space, objective); these override the defaults',
  });

/** What the nightly comparison keeps of one mark (MarkRecord of the tender outputs). */
export const MarkRecordJson = z
  .strictObject({
    mark: z.string().min(1).max(40),
    adoptedPasses: z.boolean().optional().meta({ description: 'the adopted section passed every check (absent: no adopted section)' }),
    adoptedGoverning: z.string().optional().meta({ description: 'id of the governing check of the adopted section' }),
    lightestMass: z.number().nonnegative().nullable().meta({ description: 'mass of one girder of the lightest feasible section, kg (null: none feasible)' }),
    lightestGoverning: z.string().nullable().meta({ description: 'id of the governing check of the lightest section' }),
  })
  .meta({ id: 'ScheduleMarkRecord' });

/**
 * A baseline for the regression comparison: the `records` of an earlier schedule result (the
 * whole earlier result may be given; only `records` is read), or the records alone.
 */
export const BaselineJson = z
  .preprocess((v) => (Array.isArray(v) ? { records: v } : v), z.looseObject({ records: z.array(MarkRecordJson) }))
  .meta({ id: 'ScheduleBaseline', description: 'the records of a previous schedule result ({ records: [...] }, or the array alone)' });

/** Tender options of a schedule run. */
export const TenderOptionsJson = z
  .strictObject({
    rates: z
      .partialRecord(z.enum(GRADES as unknown as [GradeName, ...GradeName[]]), z.number().nonnegative().refine(Number.isFinite, { message: 'a rate must be finite' }))
      .optional()
      .meta({ description: 'material cost per kg of each grade (in `currency`); gives the cost lines' }),
    currency: z.string().min(1).max(12).optional().meta({ description: 'currency of the rates and costs, printed beside every cost, e.g. "EUR" or "GBP"' }),
    rationalise: z
      .number()
      .int()
      .min(1)
      .max(50)
      .optional()
      .meta({ description: 'rationalise to at most K = 1 … this many distinct sections (MILP); absent: no rationalisation' }),
    objective: z.enum(['mass', 'cost']).default('mass').meta({ description: 'what the rationalisation minimises (cost needs rates)' }),
    maxPairs: z
      .number()
      .int()
      .min(1)
      .max(1_000_000)
      .default(20_000)
      .meta({ description: 'largest marks × candidates the rationalisation takes on (each pair is one full check); above it the rationalisation is skipped with a reason' }),
  })
  .meta({ id: 'ScheduleTenderOptions' });
export type TenderOptionsJson = z.output<typeof TenderOptionsJson>;

export const ScheduleJson = z
  .strictObject({
    name: z.string().max(200).optional().meta({ description: 'free text name of the schedule' }),
    baseline: BaselineJson.optional().meta({ description: 'records of a previous run: every mark is compared with it (regression)' }),
    compare: z
      .strictObject({ massTolerance: z.number().min(0).max(1).default(0.01).meta({ description: 'relative change of the lightest mass reported as a change, - (0.01 = 1 %)' }) })
      .optional(),
    tender: TenderOptionsJson.optional(),
    defaults: z
      .record(z.string(), z.unknown())
      .default({})
      .meta({ description: 'fields shared by every mark (any SearchInput field); a mark\'s own fields win, `space` and `options` are merged one level deep' }),
    girders: z.array(GirderEntryJson).min(1, { message: 'a schedule needs at least one girder' }).max(500, { message: 'at most 500 marks per schedule' }),
  })
  .superRefine((s, ctx) => {
    const seen = new Map<string, number>();
    s.girders.forEach((g, i) => {
      const j = seen.get(g.mark);
      if (j !== undefined) ctx.addIssue({ code: 'custom', path: ['girders', i, 'mark'], message: `mark "${g.mark}" repeats girders[${j}].mark` });
      else seen.set(g.mark, i);
    });
  })
  .meta({ id: 'Schedule', description: 'a schedule of girder marks searched (and, where a section is adopted, checked) one by one' });

export type ScheduleJson = z.output<typeof ScheduleJson>;
export type MarkRecordJson = z.output<typeof MarkRecordJson>;
export type BaselineJson = z.output<typeof BaselineJson>;
export type GirderEntryJson = z.output<typeof GirderEntryJson>;

/** Keys merged one level deep rather than replaced. */
const DEEP = new Set(['space', 'options']);

const isPlain = (v: unknown): v is Record<string, unknown> => typeof v === 'object' && v !== null && !Array.isArray(v);

/**
 * The fields of one mark: the defaults with the girder's own fields over them (girder wins);
 * `space` and `options` merged one level deep. `mark`, `quantity` and `adopted` are not fields
 * of the problem and are left out. Own enumerable keys only (no prototype keys are copied).
 */
export function mergeGirder(defaults: Readonly<Record<string, unknown>>, girder: Readonly<Record<string, unknown>>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(defaults)) out[k] = v;
  for (const [k, v] of Object.entries(girder)) {
    if (k === 'mark' || k === 'quantity' || k === 'adopted') continue;
    const base = out[k];
    out[k] = DEEP.has(k) && isPlain(base) && isPlain(v) ? { ...base, ...v } : v;
  }
  return out;
}

/** The problem fields of a mark (defaults merged, the search's own fields left out): add "section" for a check. */
export function checkFieldsOf(defaults: Readonly<Record<string, unknown>>, girder: Readonly<Record<string, unknown>>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(mergeGirder(defaults, girder))) if (k !== 'space' && k !== 'objective' && k !== 'cost') out[k] = v;
  return out;
}

/** Published result of a schedule run (shape of ScheduleResult). */
export const MarkErrorJson = z.object({
  code: z.string(),
  message: z.string(),
  field: z.string().optional(),
  hint: z.string().optional(),
  issues: z.array(z.object({ path: z.string(), pointer: z.string(), message: z.string(), code: z.string(), kind: z.enum(['shape', 'value']) })).optional(),
});

export const ScheduleResultJson = z
  .object({
    name: z.string().nullable(),
    marks: z.array(
      z.object({
        mark: z.string(),
        quantity: z.number(),
        status: z.enum(['ok', 'failed']),
        search: PublishedSearchJson.nullable(),
        adopted: PublishedVerdictJson.nullable().meta({ description: 'the adopted section checked for the mark (selfWeight kN/m)' }),
        error: MarkErrorJson.optional(),
      }),
    ),
    totals: z.object({
      marks: z.number(),
      marksFailed: z.number(),
      girders: z.number().meta({ description: 'Σ quantity, -' }),
      tonnage: z.number().meta({ description: 'Σ quantity × lightest mass, t' }),
      marksWithoutFeasible: z.array(z.string()),
      adoptedFailing: z.array(z.string()),
    }),
  })
  .meta({ id: 'ScheduleResult' });

export const ScheduleProgressJson = z
  .object({
    marksDone: z.number(),
    marksTotal: z.number(),
    currentMark: z.string().nullable(),
    elapsedMs: z.number().meta({ description: 'ms' }),
    estimateMs: z.number().nullable().meta({ description: 'remaining, estimated from the mean time per mark, ms' }),
  })
  .meta({ id: 'ScheduleProgress' });

/**
 * A finished schedule run (finishSchedule): the ScheduleResult with the record of every mark,
 * the comparison with the baseline, and the tender outputs. Described loosely here (its parts
 * are the tender functions' documented shapes); this is the document `--out` writes.
 */
export const ScheduleRunResultJson = ScheduleResultJson.extend({
  format: z.literal('platesmith-schedule-result'),
  version: z.literal(1),
  caution: z.string().meta({ description: 'a design aid: results to be checked by a competent engineer against the governing code and national annex' }),
  scope: z.string().meta({ description: 'what the checks do not cover' }),
  records: z.array(MarkRecordJson).meta({ description: 'one per mark; give this document (or { records }) as the baseline of a later run' }),
  comparison: z
    .object({
      massTolerance: z.number(),
      results: z.array(
        z.object({
          mark: z.string(),
          status: z.enum(['pass', 'regressed', 'changed', 'new', 'removed']),
          reasons: z.array(z.string()),
          baseline: MarkRecordJson.nullable(),
          current: MarkRecordJson.nullable(),
        }),
      ),
      counts: z.record(z.string(), z.number()),
      regressed: z.array(z.string()),
    })
    .nullable()
    .meta({ description: 'comparison with the baseline, mark by mark; null without a baseline' }),
  tender: z
    .object({
      basis: z.array(z.object({ mark: z.string(), section: z.enum(['adopted', 'lightest']) })),
      leftOut: z.array(z.object({ mark: z.string(), reason: z.string() })),
      reconciliation: z
        .unknown()
        .meta({ description: 'byMark (section counted, kg per girder against the lightest, saving), used = lightest + saving, kg; null without tonnage' }),
      currency: z.string().nullable().meta({ description: 'currency of the costs, as given in tender.currency' }),
      tonnage: z.unknown().meta({ description: 'total, byGrade, byThickness, byMark (quantity included), plates, cost; masses kg, lengths mm; null when no mark has a section' }),
      rationalisation: z.unknown().meta({ description: 'objective, unrationalised, byK (K, total, penalty kg or cost, sections, assignment), or { skipped }; null when not asked' }),
    })
    .meta({ description: 'tonnage, plate list, cost and rationalisation' }),
}).meta({ id: 'ScheduleRunResult' });
