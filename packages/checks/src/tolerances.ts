/**
 * The check library's tolerances, each named once with its reason. A bound in the search that
 * mirrors a decision of a check (does it pass, is a moment a sign, is a station in a panel) uses
 * these very constants, so the two cannot drift apart.
 */

/** Round-off allowed on a utilisation: a check passes at utilisation ≤ 1 + this. */
export const PASS_ALLOWANCE = 1e-9;

/** The largest utilisation that passes (1 + PASS_ALLOWANCE). */
export const PASS_LIMIT = 1 + PASS_ALLOWANCE;

/** A moment below this fraction of the largest |MEd| (and below 1 N·mm) is round-off of the analysis, not a sign of bending. */
export const MOMENT_ROUND_OFF = 1e-9;

/**
 * The largest |moment| (N·mm) that counts as round-off among moments whose largest |MEd| is
 * `maxAbs`: max(1 N·mm, MOMENT_ROUND_OFF · maxAbs). Used by the checks to decide which flange is
 * ever in compression, and by the search's bounds to decide the same from an envelope.
 */
export function negligibleMoment(maxAbs: number): number {
  return Math.max(1, MOMENT_ROUND_OFF * maxAbs);
}

/** A station within this distance (mm) of a panel's edge lies in that panel (edges are shared). */
export const PANEL_EDGE_MM = 1e-9;

/** Two positions along the girder closer than this (mm) are the same (a stiffener and a panel end; a station and hw/2 from a support). */
export const SAME_POSITION_MM = 1e-6;

/** An ineffective zone of the web shorter than this (mm) is no hole (EN 1993-1-5 4.4: the web is fully effective). */
export const NO_HOLE_MM = 1e-9;

/** A rectangle of an effective section thinner than this (mm) is dropped (it carries nothing). */
export const EMPTY_RECT_MM = 1e-12;

/** Ratios (α, ψ) within this of a special case's value are that case (pure bending: α = 0.5, ψ = −1). */
export const SAME_RATIO = 1e-12;

/** What a fully reduced strength (MPa) or thickness (mm) keeps in 6.2.8, so the rectangle stays one (it carries ~nothing). */
export const VANISHING = 1e-6;

/** Relative margin by which a bearing flat's crushing resistance may fall short of the reaction in sizing (round-off of 9.4). */
export const BEARING_SIZING_MARGIN = 1e-6;

/**
 * The closed forms on plain numbers the search bounds with (iyOfPlates, plateStackMel) agree with
 * grossProps to 1e-12 relative (property tests); a bound built on one widens by this relative
 * margin, so round-off never excludes a candidate the check would pass.
 */
export const CLOSED_FORM_MARGIN = 1e-9;
