import { z } from 'zod';

/**
 * The domain limit of every number of the public JSON (issue 16: bounded work for any input).
 * A value beyond one is a 422 naming the field and the limit; derived work (stations ×
 * combinations × patterns) has its own cap in the analysis, checked before any array is built.
 * The limits are generous for plate girders (common practice, no source) and tight enough
 * that no request can wedge the service: every count bounds an array, every magnitude keeps the
 * results finite.
 */
export const LIMITS = {
  /** a span, or the distance between two supports of an envelope, mm (300 m) */
  spanMm: 300_000,
  /** spans of a beam problem */
  spans: 20,
  /** the whole girder, mm (20 spans of 300 m) */
  lengthMm: 6_000_000,
  /** actions of a problem */
  actions: 100,
  /** |value| of an action: kN/m (distributed) or kN (point) */
  loadValue: 100_000,
  /** stiff bearing length, mm */
  bearingLengthMm: 10_000,
  /** double-sided bearing-stiffener pairs side by side over one support (a section given) */
  bearingPairs: 10,
  /** partial and combination factors (γ, ξ) */
  factor: 10,
  /** deflection limit ratio span/ratio */
  deflectionRatio: 100_000,
  /** |M| at a station, kNm */
  momentKNm: 1e8,
  /** |V|, |R|, F, kN */
  forceKN: 1e7,
  /** stations of an envelope or of raw effects */
  stations: 10_000,
  /** lateral restraints: the least spacing, mm, and the most positions */
  restraintSpacingMm: 100,
  restraints: 2_000,
  /** intermediate stiffeners of a section: the least spacing, mm (the most follow from it and the length) */
  stiffenerSpacingMm: 100,
  /** analysis stations at the stiffener positions of a search space (Σ over panel counts and spans) */
  stiffenerStations: 20_000,
  /** overall depth bounds of a space, mm */
  depthMm: 20_000,
  /** fabrication rule ratios (tf/tw, bf/tf) */
  ruleRatio: 1_000,
  /** cost model rates and factors */
  costRate: 1e6,
} as const;

/** A finite number between `min` and `max` (inclusive), with its unit in every message. */
export function bounded(what: string, unit: string, min: number, max: number) {
  return z
    .number({ error: `${what} must be a number (${unit})` })
    .refine(Number.isFinite, { message: `${what} must be finite` })
    .refine((v) => v >= min, { message: `${what} must be at least ${min} (${unit})` })
    .refine((v) => v <= max, { message: `${what} must be at most ${max} (${unit})` });
}
