import { z } from 'zod';
import { bounded, LIMITS } from './limits.js';
import { CheckOptionsJson } from './options.js';

const num = (what: string, unit: string, min: number, max: number) =>
  bounded(what, unit, min, max).meta({ description: `${what}, ${unit} (${min === Number.NEGATIVE_INFINITY ? `at most ${max}` : `${min} … ${max}`})` });
const position = (what: string, unit: string) => num(what, unit, -LIMITS.lengthMm, LIMITS.lengthMm);
const psi = (what: string) => num(what, '-', 0, 1);
const factor = (what: string) => num(what, '-', 0, LIMITS.factor);

export const ActionJson = z
  .strictObject({
    kind: z.enum(['permanent', 'variable']),
    load: z.enum(['udl', 'partial-udl', 'point']),
    value: num('value', 'kN/m for udl and partial-udl, kN for point; downward positive', -LIMITS.loadValue, LIMITS.loadValue),
    at: position('at', 'mm from the left end (point loads)').optional(),
    from: position('from', 'mm from the left end (partial-udl)').optional(),
    to: position('to', 'mm from the left end (partial-udl)').optional(),
    ss: num('ss', 'mm, stiff bearing length of a point load (default 100)', 0, LIMITS.bearingLengthMm).optional(),
    psi0: psi('psi0').optional(),
    psi1: psi('psi1').optional(),
    psi2: psi('psi2').optional(),
    category: z
      .enum(['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H', 'snow', 'snow-high-altitude', 'wind', 'temperature', 'road-TS', 'road-UDL', 'road-footway', 'road-single-axle', 'bridge-wind', 'bridge-temperature'])
      .optional()
      .meta({ description: 'EN 1990 Table A1.1 category giving ψ0, ψ1, ψ2; or Table A2.1 (road bridges): road-TS, road-UDL, road-footway, road-single-axle, bridge-wind, bridge-temperature' }),
    group: z.string().min(1).max(40).optional().meta({ description: "traffic group (EN 1991-2 4.5, e.g. 'gr1a'): variable actions of one group lead together as one action" }),
    name: z.string().max(80).optional(),
  })
  .meta({ id: 'Action', description: 'a characteristic action on the girder' });

export const DeflectionLimitJson = z.strictObject({
  name: z.string().min(1).max(60),
  ratio: num('ratio', 'limit = span / ratio', 1, LIMITS.deflectionRatio),
  combination: z.enum(['characteristic', 'frequent', 'quasi-permanent']).default('characteristic'),
  include: z.enum(['all', 'variable']).default('all').meta({ description: "'variable': variable actions only" }),
});

export const FactorsGJson = z
  .strictObject({
    gammaGsup: factor('gammaGsup').optional(),
    gammaGinf: factor('gammaGinf').optional(),
    gammaQ: factor('gammaQ').optional(),
    gammaQTraffic: factor('gammaQTraffic').optional().meta({ description: 'γQ of road traffic under annex A2-road (recommended 1.35)' }),
    xi: num('xi', '-', 0, 1).optional(),
  })
  .meta({ description: 'EN 1990 Table A1.2(B) factors (recommended 1.35, 1.00, 1.50, ξ 0.85)' });

/** A beam problem: spans (mm, simply supported ends, continuous over inner supports) and actions. */
export const BeamProblemFields = {
  // no lower bound here: a span under 1 m is the analysis's SPAN_IMPLAUSIBLE, with its hint that lengths are in mm
  spans: z
    .array(bounded('span', 'mm', Number.NEGATIVE_INFINITY, LIMITS.spanMm))
    .min(1, { message: 'give at least one span' })
    .max(LIMITS.spans, { message: `at most ${LIMITS.spans} spans` })
    .meta({ description: `span lengths, mm (24000 for 24 m), each at most ${LIMITS.spanMm}` }),
  actions: z.array(ActionJson).max(LIMITS.actions, { message: `at most ${LIMITS.actions} actions` }),
  combination: z.enum(['6.10', '6.10ab']).optional().meta({ description: 'EN 1990 eq. 6.10, or the worse of 6.10a and 6.10b; default 6.10' }),
  annex: z.enum(['A1', 'A2-road']).optional().meta({ description: 'EN 1990 Annex A1 (buildings, default) or A2 for road bridges: Table A2.4(B) factors (γQ 1.35 road traffic, 1.50 others), traffic groups' }),
  factors: FactorsGJson.optional(),
  deflection: z.array(DeflectionLimitJson).max(10).optional().meta({ description: 'default: total span/250 and variable span/360, characteristic' }),
  gridDivisions: z.number().int().min(4).max(400).optional().meta({ description: 'analysis stations per span (default 40)' }),
};

/** Design effects from the user's own global analysis (bridges, frames). */
export const EnvelopeJson = z
  .strictObject({
    length: num('length', 'mm', Number.NEGATIVE_INFINITY, LIMITS.lengthMm),
    supports: z.array(position('support', 'mm')).min(2).max(LIMITS.spans + 1).optional().meta({ description: 'support positions, mm; default both ends' }),
    stations: z
      .array(z.strictObject({ x: position('x', 'mm'), M: num('M', 'kNm, sagging positive', -LIMITS.momentKNm, LIMITS.momentKNm), V: num('V', 'kN', -LIMITS.forceKN, LIMITS.forceKN) }))
      .min(1)
      .max(LIMITS.stations, { message: `at most ${LIMITS.stations} stations` }),
    reactions: z.array(z.strictObject({ x: position('x', 'mm'), R: num('R', 'kN', -LIMITS.forceKN, LIMITS.forceKN) })).max(LIMITS.spans + 1).optional(),
    forces: z.array(z.strictObject({ x: position('x', 'mm'), F: num('F', 'kN', -LIMITS.forceKN, LIMITS.forceKN), ss: num('ss', 'mm', 0, LIMITS.bearingLengthMm) })).max(LIMITS.actions).optional(),
  })
  .superRefine((e, ctx) => {
    // each span of the envelope within the span limit, as a beam problem's
    const xs = e.supports ? [...e.supports].sort((a, b) => a - b) : [0, e.length];
    for (let i = 1; i < xs.length; i++) {
      if (xs[i]! - xs[i - 1]! > LIMITS.spanMm) {
        ctx.addIssue({ code: 'custom', path: e.supports ? ['supports'] : ['length'], message: `a span of ${xs[i]! - xs[i - 1]!} mm between supports is over ${LIMITS.spanMm} mm (300 m)` });
        break;
      }
    }
  })
  .meta({ id: 'Envelope' });

export const ProblemFields = {
  spans: BeamProblemFields.spans.optional(),
  actions: BeamProblemFields.actions.optional(),
  combination: BeamProblemFields.combination,
  annex: BeamProblemFields.annex,
  factors: BeamProblemFields.factors,
  deflection: BeamProblemFields.deflection,
  gridDivisions: BeamProblemFields.gridDivisions,
  envelope: EnvelopeJson.optional(),
  options: CheckOptionsJson.default(CheckOptionsJson.parse({})),
  note: z.string().max(2000).optional().meta({ description: 'free text carried along (e.g. the girder mark)' }),
};

export const ProblemJson = z
  .strictObject(ProblemFields)
  .superRefine((p, ctx) => problemShape(p, ctx))
  .meta({ id: 'Problem', description: 'spans and actions (analysed here), or an envelope of design effects' });

export function problemShape(p: { spans?: unknown; actions?: unknown; envelope?: unknown }, ctx: z.RefinementCtx): void {
  if (p.envelope !== undefined && (p.spans !== undefined || p.actions !== undefined)) {
    ctx.addIssue({ code: 'invalid_type', expected: 'object', path: ['envelope'], message: 'give either spans and actions or an envelope, not both' } as never);
  }
  if (p.envelope === undefined && (p.spans === undefined || p.actions === undefined)) {
    ctx.addIssue({ code: 'invalid_type', expected: 'array', path: [p.spans === undefined ? 'spans' : 'actions'], message: 'a problem needs spans and actions (or an envelope)' } as never);
  }
}

export type ProblemJson = z.output<typeof ProblemJson>;
