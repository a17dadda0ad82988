import type { FlangeSide } from '../section.js';
import type { CheckContext, CheckResult, CheckValue, Effects } from '../types.js';
import { governs, notApplicable, verdict } from '../result.js';
import { bendingCheck, bendingForSign, envelopeAt, pickM, sideName, signsOf, type SignBending } from './bending.js';
import { flangeInducedCheck } from '../en1993-1-5/flange-induced.js';
import { ALL_FORCES_STIFFENED, patchBendingInteraction, patchForForce, patchLoadingCheck, unstiffenedForces } from '../en1993-1-5/patch-loading.js';
import { ltbCheck, pickSag as pickSagAt } from './ltb.js';
import { deflectionCheck } from '../sls/deflection.js';
import { BENDING_IDS, type BendingCheckId } from '../registry.js';
import { weldCheck } from '../en1993-1-8/weld.js';
import { restraintStiffenerCheck } from './restraint-stiffener.js';

/** The bending family's checks, each computed on first call; shared intermediates computed once. */
export function bendingThunks(ctx: CheckContext, e: Effects): Record<BendingCheckId, () => CheckResult> {
  let perMap: Map<FlangeSide, SignBending> | null = null;
  const cache = new Map<FlangeSide, SignBending>();
  const per = (): Map<FlangeSide, SignBending> => {
    if (!perMap) {
      perMap = new Map();
      for (const side of signsOf(e.stations)) {
        const b = bendingForSign(ctx, side);
        perMap.set(side, b);
        cache.set(side, b);
      }
    }
    return perMap;
  };
  const bendingFor = (side: FlangeSide): SignBending => {
    per();
    let b = cache.get(side);
    if (!b) {
      b = bendingForSign(ctx, side);
      cache.set(side, b);
    }
    return b;
  };
  return {
    classification: () => classificationCheck(per()),
    bending: () => bendingCheck(ctx, e, per()),
    'flange-induced-buckling': () => flangeInducedCheck(ctx, per()),
    'patch-loading': () => patchLoadingCheck(ctx, e),
    'patch-bending': () => patchBendingCheck(ctx, e, bendingFor),
    'lateral-torsional-buckling': () => ltbCheck(ctx, e, per(), bendingFor),
    deflection: () => deflectionCheck(ctx, e),
    'restraint-stiffener': () => restraintStiffenerCheck(ctx, e),
    'web-flange-weld': () => weldCheck(ctx, e),
  };
}


/**
 * The bending family of checks for one section under the design effects: classification,
 * bending, flange-induced buckling, patch loading and its interaction with bending, lateral-
 * torsional buckling, deflection and the web-to-flange welds — one result per id, in that order.
 */
export function bendingChecks(ctx: CheckContext, e: Effects): CheckResult[] {
  const t = bendingThunks(ctx, e);
  return BENDING_IDS.map((id) => t[id]());
}

/**
 * 'classification' (EN 1993-1-1 5.5, Table 5.2): never fails — utilisation 0, the class in values.
 * The reported class is the worse over the signs of moment that occur; per-sign values are suffixed.
 */
export function classificationCheck(per: ReadonlyMap<FlangeSide, SignBending>): CheckResult {
  let gov: SignBending | null = null;
  for (const b of per.values()) if (!gov || b.cls.sectionClass > gov.cls.sectionClass) gov = b;
  const c = gov!.cls;
  const values: Record<string, CheckValue> = {
    sectionClass: c.sectionClass,
    flangeClass: c.flangeClass,
    webClass: c.webClass,
    cOverTflange: c.cOverTflange,
    cOverTweb: c.cOverTweb,
    alpha: c.alpha,
    psi: c.psi,
    sign: sideName(c.side),
    weldThroatInC: c.throat,
    webC: 'hw (weld allowance ignored, conservative)',
  };
  for (const [side, b] of per) {
    const n = sideName(side);
    values[`sectionClass_${n}`] = b.cls.sectionClass;
    values[`flangeClass_${n}`] = b.cls.flangeClass;
    values[`webClass_${n}`] = b.cls.webClass;
  }
  return { ...verdict('classification', 'EN 1993-1-1 5.5, Table 5.2', 0, null, values), passes: true };
}

/**
 * 'patch-loading' with bending, EN 1993-1-5 7.2: η2 + 0.8 η1 ≤ 1.4 at each force, with MEd at x
 * (envelope of the stations, interpolated) and η1 = |MEd| / (fy Weff/γM0): Mel,Rd for Class 1–3,
 * Meff,Rd for Class 4, for the sign of MEd at x. utilisation = (η2 + 0.8 η1)/1.4.
 */
export function patchBendingCheck(ctx: CheckContext, e: Effects, bendingFor: (side: FlangeSide) => SignBending): CheckResult {
  const clause = 'EN 1993-1-5 7.2';
  if (e.forces.length === 0) return notApplicable('patch-bending', clause, 'no concentrated forces enter through a flange without a stiffener');
  const forces = unstiffenedForces(ctx, e);
  if (forces.length === 0) return notApplicable('patch-bending', clause, ALL_FORCES_STIFFENED);
  let best: { u: number; at: number; values: Record<string, CheckValue> } | null = null;
  for (const f of forces) {
    const r = patchForForce(ctx, f.x, f.ss);
    const MEd = envelopeAt(e.stations, f.x, pickSagAt).value;
    // 7.2(1) is for a force on the compression flange: the top flange, under sagging
    if (!(MEd > 0)) continue;
    const side: FlangeSide = 'top';
    const b = bendingFor(side);
    const MRd = b.eff ? b.McRd : b.MelRd;
    const eta1 = Math.abs(MEd) / MRd;
    const eta2 = Math.abs(f.F) / r.FRd;
    const it = patchBendingInteraction(eta1, eta2);
    if (governs(it.utilisation, best?.u)) {
      best = { u: it.utilisation, at: f.x, values: { eta1, eta2, interaction: it.value, limit: 1.4, MEd, MRdElastic: MRd, FRd: r.FRd, F: Math.abs(f.F) } };
    }
  }
  if (!best) return notApplicable('patch-bending', clause, 'the loaded (top) flange is in tension at every force: EN 1993-1-5 7.2(1) does not apply');
  return verdict('patch-bending', clause, best.u, best.at, best.values);
}
