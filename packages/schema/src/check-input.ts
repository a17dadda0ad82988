import { z } from 'zod';
import { bounded, LIMITS } from './limits.js';
import { SectionJson } from './section.js';
import { CheckOptionsJson } from './options.js';

const num = (what: string, unit: string, max: number, min = -max) => bounded(what, unit, min, max);

/** Span in mm; a value under 1 m is almost always a length given in metres. */
export const SpanMm = z
  .number({ error: 'span must be a number of mm' })
  .refine(Number.isFinite, { message: 'span must be finite' })
  .refine((v) => v > 0, { message: 'span must be positive (mm)' })
  .refine((v) => v >= 1000, { message: 'span under 1 m: lengths are in mm (e.g. 24000 for 24 m)' })
  .refine((v) => v <= LIMITS.spanMm, { message: `span over ${LIMITS.spanMm} mm (300 m) is outside the scope of a plate girder` })
  .meta({ description: 'span, mm (24000 for 24 m)' });

export const EffectJson = z
  .strictObject({
    x: num('x', 'mm', LIMITS.spanMm).meta({ description: 'station from the left end, mm' }),
    M: num('M', 'kNm', LIMITS.momentKNm).meta({ description: 'design bending moment MEd, kNm (positive sagging: top flange in compression)' }),
    V: num('V', 'kN', LIMITS.forceKN).meta({ description: 'coexisting design shear VEd, kN' }),
    F: num('F', 'kN', LIMITS.forceKN, 0).optional().meta({ description: 'concentrated design force through the top flange, kN' }),
    ss: num('ss', 'mm', LIMITS.bearingLengthMm, 0).optional().meta({ description: 'stiff bearing length of F, mm' }),
  })
  .meta({ id: 'Effect' });

export const SlsUdlJson = z.strictObject({
  name: z.string().min(1).max(60),
  ratio: num('ratio', '-', LIMITS.deflectionRatio, 1).meta({ description: 'limit = span / ratio' }),
  udl: num('udl', 'kN/m', LIMITS.loadValue).meta({ description: 'SLS uniformly distributed load for this limit, kN/m (simply supported span)' }),
});

export const CheckEffectsInput = z
  .strictObject({
    note: z.string().max(2000).optional().meta({ description: 'free text carried along (e.g. the girder mark)' }),
    section: SectionJson,
    span: SpanMm,
    effects: z.array(EffectJson).min(1, { message: 'give at least one station' }).max(LIMITS.stations, { message: `at most ${LIMITS.stations} stations` }),
    reactions: z.array(z.strictObject({ x: num('x', 'mm', LIMITS.spanMm), R: num('R', 'kN', LIMITS.forceKN).meta({ description: 'design reaction, kN' }) })).max(2).optional(),
    sls: z.array(SlsUdlJson).max(10).optional(),
    options: CheckOptionsJson.default(CheckOptionsJson.parse({})),
  })
  .superRefine((v, ctx) => {
    v.effects.forEach((e, i) => {
      if (e.x < 0 || e.x > v.span) ctx.addIssue({ code: 'custom', path: ['effects', i, 'x'], message: `station x = ${e.x} mm is outside the span 0…${v.span} mm` });
      if (e.F !== undefined && e.ss === undefined) ctx.addIssue({ code: 'custom', path: ['effects', i, 'ss'], message: 'a concentrated force F needs its stiff bearing length ss (mm)' });
    });
  })
  .meta({ id: 'CheckEffectsInput', description: 'a section checked under design effects given at stations' });

export type CheckEffectsInput = z.output<typeof CheckEffectsInput>;
