import { governs, notApplicable, verdict } from '../result.js';
import { absAt, envelopeAt, pickM, pickV } from '../en1993-1-1/bending.js';
import type { CheckContext, CheckResult, Effects, Station } from '../types.js';
import { SHEAR_IDS, type ShearCheckId } from '../registry.js';
import { bearingStiffenerAt, rigidEndPost } from './end-post.js';
import { stationInteraction628, stationInteraction71, type StationInteraction } from './interaction.js';
import { panelMomentForVbf, panelShear, stationShear, stationsIn, type PanelShear, type StationShear } from './shear-buckling.js';
import { shearArea, vplRd } from './shear-plastic.js';
import { flatTorsion, siteSection, siteStrength, stiffenerIstMin, stiffenerSites } from './stiffeners.js';
import { PANEL_EDGE_MM } from '../tolerances.js';
import { loadStiffenerCheck } from './load-stiffener.js';

/**
 * The EN 1993-1-5 shear family: one result per id, in this order: 'shear', 'shear-buckling',
 * 'bending-shear', 'stiffener-stiffness', 'stiffener-strength', 'load-bearing-stiffener', 'stiffener-torsion', 'end-post',
 * 'bearing-stiffener'. Each is the worst station / panel / stiffener; `at` its x (mm).
 */
export function shearChecks(ctx: CheckContext, e: Effects): CheckResult[] {
  const t = shearThunks(ctx, e);
  return SHEAR_IDS.map((id) => t[id]());
}

/** The shear family's checks, each computed on first call; the panel analysis computed once. */
export function shearThunks(ctx: CheckContext, e: Effects): Record<ShearCheckId, () => CheckResult> {
  let panels: PanelShear[] | null = null;
  const ps = (): PanelShear[] => (panels ??= panelShear(ctx));
  return {
    shear: () => shearCheck(ctx, e.stations),
    'shear-buckling': () => shearBucklingCheck(ctx, ps(), e.stations),
    'bending-shear': () => bendingShearCheck(ctx, ps(), e.stations),
    'stiffener-stiffness': () => stiffenerStiffnessCheck(ctx),
    'stiffener-strength': () => stiffenerStrengthCheck(ctx, e.stations),
    'load-bearing-stiffener': () => loadStiffenerCheck(ctx, e),
    'stiffener-torsion': () => stiffenerTorsionCheck(ctx),
    'end-post': () => endPostCheck(ctx),
    'bearing-stiffener': () => bearingStiffenerCheck(ctx, e),
  };
}

const NO_STATIONS = 'no design effects given';

/** EN 1993-1-1 6.2.6: |VEd| ≤ Vpl,Rd = η hw tw fyw/(√3 γM0). */
export function shearCheck(ctx: CheckContext, stations: readonly Station[]): CheckResult {
  const { s, o, m } = ctx;
  const clause = 'EN 1993-1-1 6.2.6';
  const Av = shearArea(s.hw, s.tw, o.eta);
  const VplRd = vplRd(s.hw, s.tw, m.fyw, o.eta, o.factors.gammaM0);
  if (stations.length === 0) return notApplicable('shear', clause, NO_STATIONS, { Av, VplRd });
  let worst = stations[0]!;
  for (const st of stations) if (Math.abs(st.VEd) > Math.abs(worst.VEd)) worst = st;
  return verdict('shear', clause, Math.abs(worst.VEd) / VplRd, worst.x, { Av, VplRd, VEd: Math.abs(worst.VEd) });
}

/** EN 1993-1-5 5.2–5.5: every panel that 5.1(2) requires, at every station in it. */
export function shearBucklingCheck(ctx: CheckContext, panels: readonly PanelShear[], stations: readonly Station[]): CheckResult {
  const { s } = ctx;
  const clause = 'EN 1993-1-5 5.2';
  const needed = panels.filter((p) => p.needed);
  const hwOverTw = s.hw / s.tw;
  if (needed.length === 0) {
    const limit = Math.min(...panels.map((p) => p.limit));
    const rule = s.stiffeners ? '31ε√kτ/η' : '72ε/η';
    return notApplicable('shear-buckling', 'EN 1993-1-5 5.1(2)', `hw/tw = ${hwOverTw.toFixed(1)} ≤ ${rule} = ${limit.toFixed(1)}: no shear buckling check required`, { hwOverTw, limit });
  }
  if (stations.length === 0) return notApplicable('shear-buckling', clause, NO_STATIONS);
  let best: { ps: PanelShear; r: StationShear } | null = null;
  for (const ps of needed) {
    const inPanel = stationsIn(stations, ps.panel.x0, ps.panel.x1);
    const MEdVbf = panelMomentForVbf(ctx, inPanel);
    for (const st of inPanel) {
      const r = stationShear(ctx, ps, st, MEdVbf);
      if (best === null || r.utilisation > best.r.utilisation) best = { ps, r };
    }
  }
  if (best === null) return notApplicable('shear-buckling', clause, NO_STATIONS);
  const { ps, r } = best;
  return verdict('shear-buckling', clause, r.utilisation, r.station.x, {
    kTau: ps.kTau,
    lambdaW: ps.lambdaW,
    chiW: ps.chiW,
    VbwRd: ps.VbwRd,
    VbfRd: r.VbfRd,
    MEdVbf: r.MEdVbf,
    VbfReading: "5.4(1) with the panel's largest MEd (conservative, common practice)",
    VbRd: r.VbRd,
    a: ps.panel.a,
    endPost: ps.endPost,
    c: r.c,
    MfRd: r.MfRd,
    VEd: Math.abs(r.station.VEd),
    MEd: r.station.MEd,
    hwOverTw,
    limit: ps.limit,
  });
}

/** EN 1993-1-5 7.1 where the panel needs 5.1(2), else EN 1993-1-1 6.2.8. */
export function bendingShearCheck(ctx: CheckContext, panels: readonly PanelShear[], stations: readonly Station[]): CheckResult {
  if (stations.length === 0) return notApplicable('bending-shear', 'EN 1993-1-5 7.1', NO_STATIONS);
  let worst = null as StationInteraction | null;
  // 7.1(1) holds at every section but those within hw/2 of a support: add the sections at
  // support ± hw/2 (governing moment and largest |shear| interpolated between stations)
  const xA = ctx.o.supports[0]!;
  const xB = ctx.o.supports[ctx.o.supports.length - 1]!;
  const extra: Station[] = [];
  for (const xs of ctx.o.supports) {
    for (const x of [xs - ctx.s.hw / 2, xs + ctx.s.hw / 2]) {
      if (x <= xA || x >= xB) continue;
      extra.push({ x, MEd: envelopeAt(stations, x, pickM).value, VEd: absAt(stations, x, pickV) });
    }
  }
  // the panels a station lies in (within PANEL_EDGE_MM of either edge), or every panel when none: with
  // the panels in x order (as panelsOf gives them) a bisection finds the first, else a scan
  let ordered = true;
  for (let i = 1; i < panels.length; i++) if (panels[i]!.panel.x0 < panels[i - 1]!.panel.x0 || panels[i]!.panel.x1 < panels[i - 1]!.panel.x1) ordered = false;
  const consider = (ps: PanelShear, st: Station): void => {
    const c = ps.needed ? stationInteraction71(ctx, ps, st) : stationInteraction628(ctx, st);
    if (c.required && governs(c.utilisation, worst?.utilisation)) worst = c;
  };
  const visit = (st: Station): void => {
    const inside = (p: PanelShear) => st.x >= p.panel.x0 - PANEL_EDGE_MM && st.x <= p.panel.x1 + PANEL_EDGE_MM;
    let any = false;
    if (ordered) {
      let lo = 0;
      let hi = panels.length;
      while (lo < hi) {
        const mid = (lo + hi) >> 1;
        if (st.x <= panels[mid]!.panel.x1 + PANEL_EDGE_MM) hi = mid;
        else lo = mid + 1;
      }
      for (let i = lo; i < panels.length && panels[i]!.panel.x0 - PANEL_EDGE_MM <= st.x; i++) {
        if (!inside(panels[i]!)) continue;
        any = true;
        consider(panels[i]!, st);
      }
    } else {
      for (const ps of panels) {
        if (!inside(ps)) continue;
        any = true;
        consider(ps, st);
      }
    }
    if (!any) for (const ps of panels) consider(ps, st);
  };
  for (const st of stations) visit(st);
  for (const st of extra) visit(st);
  if (worst === null) {
    const anyNeeded = panels.some((p) => p.needed);
    return notApplicable(
      'bending-shear',
      anyNeeded ? 'EN 1993-1-5 7.1' : 'EN 1993-1-1 6.2.8',
      anyNeeded
        ? 'η̄3 ≤ 0.5 or η̄1 < Mf,Rd/Mpl,Rd at every station beyond hw/2 of a support: no interaction (7.1(1), 7.1(5))'
        : 'VEd ≤ 0.5 Vpl,Rd at every station: no reduction (EN 1993-1-1 6.2.8(2))',
    );
  }
  const values: Record<string, number> = { MfRd: worst.MfRd, MplRd: worst.MplRd, eta1: worst.eta1, eta3: worst.eta3 };
  if (worst.clause === 'EN 1993-1-1 6.2.8') {
    values['rho'] = worst.rho;
    values['MVRd'] = worst.MVRd;
  }
  return verdict('bending-shear', worst.clause, worst.utilisation, worst.station.x, values);
}

/** EN 1993-1-5 9.3.3(3) eq. 9.6 at every intermediate stiffener (a = the shorter adjacent panel). */
export function stiffenerStiffnessCheck(ctx: CheckContext): CheckResult {
  const clause = 'EN 1993-1-5 9.3.3(3)';
  const st = ctx.s.stiffeners;
  if (!st) return notApplicable('stiffener-stiffness', clause, 'no intermediate transverse stiffeners');
  const sites = stiffenerSites(ctx);
  if (sites.length === 0) return notApplicable('stiffener-stiffness', clause, 'stiffener spacing leaves no intermediate stiffener in any span');
  let best: CheckResult | null = null;
  for (const site of sites) {
    const sec = siteSection(ctx, site);
    const a = Math.min(site.a1, site.a2);
    const IstMin = stiffenerIstMin(a, ctx.s.hw, ctx.s.tw);
    const r = verdict('stiffener-stiffness', clause, IstMin / sec.I, site.x, {
      Ist: sec.I,
      IstMin,
      a,
      axis: st.sides === 2 ? 'web mid-plane' : 'centroid of the effective section',
    });
    if (best === null || r.utilisation > best.utilisation) best = r;
  }
  return best!;
}

/** EN 1993-1-5 9.3.3(3) eq. 9.7 with a strut check (EN 1993-1-1 6.3.1, curve c, Lcr = 0.75 hw, 9.4(2)). */
export function stiffenerStrengthCheck(ctx: CheckContext, stations: readonly Station[]): CheckResult {
  const clause = 'EN 1993-1-5 9.3.3(3)';
  if (!ctx.s.stiffeners) return notApplicable('stiffener-strength', clause, 'no intermediate transverse stiffeners');
  const sites = stiffenerSites(ctx);
  if (sites.length === 0) return notApplicable('stiffener-strength', clause, 'stiffener spacing leaves no intermediate stiffener in any span');
  if (stations.length === 0) return notApplicable('stiffener-strength', clause, NO_STATIONS);
  let best: CheckResult | null = null;
  for (const site of sites) {
    const r = siteStrength(ctx, site, stations);
    const res = verdict('stiffener-strength', clause, r.utilisation, site.x, {
      NEd: r.NEd,
      NbRd: r.NbRd,
      eN: r.eN,
      chi: r.chi,
      lambdaBar: r.lambdaBar,
      VEd: r.VEd,
      lambdaWRemoved: r.lambdaWRemoved,
      A: r.A,
    });
    if (best === null || res.utilisation > best.utilisation) best = res;
  }
  return best!;
}

/** EN 1993-1-5 9.2.1(8) eq. 9.3 for the intermediate stiffener flats and the bearing stiffener flats. */
export function stiffenerTorsionCheck(ctx: CheckContext): CheckResult {
  const clause = 'EN 1993-1-5 9.2.1(8)';
  const { s, o, m } = ctx;
  const cases: { which: string; bs: number; ts: number; at: number | null }[] = [];
  if (s.stiffeners) cases.push({ which: 'intermediate', bs: s.stiffeners.bs, ts: s.stiffeners.ts, at: ctx.stiffenerXs[0] ?? null });
  cases.push({ which: 'bearing', bs: ctx.bearing.bs, ts: ctx.bearing.ts, at: o.supports[0] ?? null });
  let best: CheckResult | null = null;
  for (const c of cases) {
    const t = flatTorsion(c.bs, c.ts, c.which === 'bearing' ? m.fyBearing : m.fyStiff, o.E);
    const r = verdict('stiffener-torsion', clause, t.limit / t.ItOverIp, c.at, { ItOverIp: t.ItOverIp, limit: t.limit, stiffener: c.which });
    if (best === null || r.utilisation > best.utilisation) best = r;
  }
  return best!;
}

/** EN 1993-1-5 9.3.1: rigid end post geometry and area; a non-rigid end post is the bearing stiffener. */
export function endPostCheck(ctx: CheckContext): CheckResult {
  const clause = 'EN 1993-1-5 9.3.1';
  if (ctx.s.endPost === 'non-rigid') {
    return notApplicable('end-post', clause, 'non-rigid end post: one bearing stiffener, checked under bearing-stiffener; χw uses the non-rigid column');
  }
  const r = rigidEndPost(ctx.s.hw, ctx.s.tw, ctx.bearing);
  return verdict('end-post', clause, r.utilisation, ctx.o.supports[0] ?? 0, {
    e: r.e,
    eMin: r.eMin,
    Ast: r.Ast,
    AstMin: r.AstMin,
    scope: 'e and stiffener area only (9.3.1(3)-(4)); the end post as a short beam resisting the tension-field anchorage force (9.3.1(2)) is not checked',
  });
}

/** EN 1993-1-5 9.4 (column, curve c, Lcr = 0.75 hw) and bearing of the sniped flats, at every reaction. */
export function bearingStiffenerCheck(ctx: CheckContext, e: Effects): CheckResult {
  const clause = 'EN 1993-1-5 9.4';
  if (e.reactions.length === 0) return notApplicable('bearing-stiffener', clause, 'no support reactions given');
  let best: CheckResult | null = null;
  for (const reaction of e.reactions) {
    const r = bearingStiffenerAt(ctx, reaction);
    const res = verdict('bearing-stiffener', clause, r.utilisation, reaction.x, {
      R: r.R,
      NbRd: r.NbRd,
      chi: r.chi,
      lambdaBar: r.lambdaBar,
      A: r.A,
      Abearing: r.Abearing,
      FbRd: r.FbRd,
      pairs: r.pairs,
      support: r.endPost,
    });
    if (best === null || res.utilisation > best.utilisation) best = res;
  }
  return best!;
}
