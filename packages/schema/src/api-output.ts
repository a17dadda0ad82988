import { z } from 'zod';
import { SectionJson } from './section.js';

/**
 * zod schemas of the published results (the shapes of publishCheck, publishVerdict,
 * publishSearch and the effects summary), so the HTTP service can declare and document its
 * responses from the same definitions. Units as in VALUE_UNITS (per check, from the check registry): kN, kNm, mm, MPa, kg.
 */
export const PublishedCheckJson = z
  .object({
    id: z.string().meta({ description: 'check id in trade words, e.g. "shear-buckling"' }),
    clause: z.string().meta({ description: 'standard and clause, e.g. "EN 1993-1-5 5.2"' }),
    applies: z.boolean(),
    reason: z.string().optional().meta({ description: 'why the check does not apply' }),
    utilisation: z.number().nullable().meta({ description: 'design effect over resistance, -; null when unbounded' }),
    passes: z.boolean(),
    at: z.number().nullable().meta({ description: 'governing station from the left end, mm' }),
    values: z
      .record(z.string(), z.union([z.number(), z.string(), z.boolean()]))
      .meta({ description: "intermediate values by the standard's symbols: forces kN, moments kNm, lengths mm, areas mm², moduli mm³, second moments mm⁴, stresses MPa" }),
    units: z
      .record(z.string(), z.enum(['kN', 'kNm', 'kN/m', 'mm', 'mm2', 'mm3', 'mm4', 'MPa', '-']))
      .meta({ description: "the unit of each numeric entry of values, as published ('-' for a ratio, factor or class)" }),
  })
  .meta({ id: 'CheckResult' });

export const AssumptionJson = z
  .object({
    field: z.string().meta({ description: 'the request field the default stands for, e.g. "options.restraint"' }),
    value: z.union([z.string(), z.number(), z.boolean(), z.array(z.number())]).meta({ description: 'the value applied' }),
    note: z.string().meta({ description: 'what the value means for the result' }),
  })
  .meta({ id: 'Assumption', description: 'a value the answer used because the request did not give it' });

export const PublishedVerdictJson = z
  .object({
    passes: z.boolean(),
    governing: PublishedCheckJson,
    checks: z.array(PublishedCheckJson),
    selfWeight: z.number().optional().meta({ description: 'self-weight added to the actions, kN/m (problem form only)' }),
    assumptions: z.array(AssumptionJson).optional().meta({ description: 'every default applied to the request' }),
    caution: z.string().optional(),
    scope: z.string().optional(),
  })
  .meta({ id: 'Verdict', description: 'every check of the section and the governing one' });

export const LimitJson = z
  .object({
    move: z.enum(['web-thickness', 'flange-thickness', 'top-flange-thickness', 'bottom-flange-thickness', 'flange-width', 'top-flange-width', 'bottom-flange-width', 'fewer-panels', 'lighter-flats', 'one-side', 'no-load-stiffeners', 'lighter-load-flats']).meta({ description: 'the one-step lighter change to the point' }),
    change: z.string().meta({ description: 'the change in words, mm, e.g. "web thickness 10 → 8"' }),
    outcome: z.enum(['fails', 'not-lighter', 'outside-space', 'passes']).meta({
      description: 'fails: a check fails the lighter section (check, clause, utilisation); not-lighter: it passes but weighs (costs) no less overall, e.g. heavier bearing stiffeners (value); outside-space: the space does not hold it (reason); passes: it passes and is lighter, which the exact search rules out',
    }),
    check: z.string().optional().meta({ description: 'the failing check with the highest utilisation' }),
    clause: z.string().optional(),
    utilisation: z.number().optional().meta({ description: 'of that check, -' }),
    value: z.number().optional().meta({ description: "the lighter section's objective value: kg, or cost units" }),
    reason: z.string().optional().meta({ description: 'why the space does not hold it' }),
  })
  .meta({ id: 'Limit', description: 'what rules out one one-step lighter neighbour of a Pareto point, judged as check judges it (its own self-weight and parts)' });

export const PublishedPointJson = z
  .object({
    depth: z.number().meta({ description: 'overall depth h = hw + tf,top + tf,bot, mm' }),
    mass: z.number().meta({ description: 'girder mass (plates, stiffeners, bearing stiffeners), kg' }),
    massPerMetre: z.number().meta({ description: 'kg/m' }),
    value: z.number().meta({ description: 'objective value: kg, or cost units' }),
    section: SectionJson,
    governing: PublishedCheckJson,
    checks: z.array(PublishedCheckJson),
    limitedBy: z.array(LimitJson).optional().meta({ description: 'what stops the point being lighter (cheaper): each one-step lighter neighbour in the space (thinner web, thinner or narrower flanges, fewer or lighter stiffeners) and what rules it out. On every point of a single search; not on schedule marks' }),
    edge: z
      .array(z.enum(['webDepth', 'webThickness', 'flangeThickness', 'flangeWidth', 'panels']))
      .optional()
      .meta({ description: 'space fields at whose largest value the point sits: the space may be too small there (a larger value might give a lighter girder). Single searches only' }),
  })
  .meta({ id: 'ParetoPoint' });

export const PublishedMissJson = z
  .object({ depth: z.number().meta({ description: 'mm' }), mass: z.number().meta({ description: 'kg' }), section: SectionJson, governing: PublishedCheckJson, failing: z.array(z.string()) })
  .meta({ id: 'NearMiss' });

export const SearchStatsJson = z
  .object({
    spaceSize: z.number().meta({ description: 'candidates in the space, -' }),
    fullEvaluations: z.number().meta({ description: 'candidates the check library judged, stopping at the first failed check (a set of plates judged once for all its stiffener layouts counts once), -' }),
    pruned: z
      .object({ depth: z.number(), rules: z.number(), shear: z.number(), bending: z.number(), flangeInducedBuckling: z.number(), deflection: z.number(), patchLoading: z.number(), patchBending: z.number(), lateralTorsional: z.number(), bearing: z.number(), sameFlanges: z.number(), webOnly: z.number(), incumbent: z.number() })
      .meta({ description: 'candidates pruned by each bound, -; lateralTorsional: rejected on lateral-torsional buckling alone (the check run on the moment envelope before the other checks, or a lower bound over every flange of a group), not counted in fullEvaluations; bearing: no stock bearing flat that fits the flanges meets the torsional requirement (EN 1993-1-5 9.2.1(8)) and carries the largest support reaction in bearing (9.4)' }),
    failedBy: z.record(z.string(), z.number()).meta({ description: 'candidates judged that failed, by the first failing check found, -' }),
    wallMs: z.number().meta({ description: 'wall time, ms' }),
    workers: z.number(),
    webConfigurations: z.number(),
  })
  .meta({ id: 'SearchStats' });

export const PublishedSearchJson = z
  .object({
    status: z.enum(['exact', 'aborted', 'infeasible']).meta({
      description: 'exact: the whole space was searched and the Pareto set is exact; infeasible: the whole space was searched and nothing passes (see nearMisses); aborted: stopped early (its time budget): every point passes every check, but the set may be incomplete',
    }),
    message: z.string().meta({ description: 'the status in words' }),
    abort: z.object({ reason: z.literal('time-budget'), budgetMs: z.number().meta({ description: 'ms' }) }).optional().meta({ description: 'why the search stopped early (status aborted)' }),
    objective: z.enum(['mass', 'cost']),
    pareto: z.array(PublishedPointJson).meta({ description: 'depth ascending; nothing shallower or as shallow is lighter' }),
    lightest: PublishedPointJson.nullable(),
    nearMisses: z.array(PublishedMissJson),
    stats: SearchStatsJson,
    assumptions: z.array(AssumptionJson).meta({ description: 'every default applied to the request' }),
    caution: z.string(),
    scope: z.string(),
  })
  .meta({ id: 'SearchResult' });

export const EffectsSummaryJson = z
  .object({
    reactions: z.array(z.object({ x: z.number().meta({ description: 'support, mm' }), R: z.number().meta({ description: 'design reaction, kN' }) })),
    stations: z.array(z.object({ x: z.number().meta({ description: 'mm' }), MEd: z.number().meta({ description: 'kNm' }), VEd: z.number().meta({ description: 'kN' }) })),
    envelope: z.object({
      MEdMax: z.number().meta({ description: 'kNm' }),
      MEdMin: z.number().meta({ description: 'kNm' }),
      VEdMax: z.number().meta({ description: 'largest |VEd|, kN' }),
    }),
    governing: z.object({ MEdMax: z.string(), MEdMin: z.string(), VEdMax: z.string() }).meta({ description: 'labels of the governing combinations' }),
    note: z.string(),
    caution: z.string(),
    scope: z.string(),
  })
  .meta({ id: 'EffectsSummary', description: 'design values of the governing ULS combinations, without the girder self-weight' });
export type EffectsSummaryJson = z.output<typeof EffectsSummaryJson>;
