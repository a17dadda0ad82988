/**
 * Judging: a set of plates is screened for lateral-torsional buckling over the self-weights of
 * its layouts, then its stiffener layouts are judged by the check library in ascending lower
 * bound, each with its own self-weight (girderSelfWeight, as `check` adds it: layouts differ in
 * stiffener mass, so in effects). The checks that read no layout are judged once per set of
 * plates and self-weight; a failure that depends only on the panels (and end post) and the
 * loads is shared with the layouts of the same self-weight, one that depends only on the web and
 * its stiffeners with every layout it also fails. A candidate that passes gets checkGirder's
 * verdict (assembleVerdict joins the two parts; a property test keeps them equal), so it is
 * never judged again.
 */
import { assembleVerdict, failsWebOnly, firstFailureAmong, girderSelfWeight, LAYOUT_IDS, PANEL_ONLY, PLATE_IDS, type CheckResult, type Judged } from '@platesmith/checks';
import { priceCost, settle, type CandidateKey } from '../core.js';
import { buildSection, flangeMass } from '../objective.js';
import { ltbFailsAt, ltbPlatesFail } from './ltb.js';
import { bearingFloorFor, bearingFloorOf, flatFailsTorsion, panelOk, partOf } from './plate-tables.js';
import { admit, keepMiss, prunes } from './staircase.js';
import { doubles, KG_PER_MM3, type LayoutsNode, type PlatesNode, type SliceState } from './state.js';

// The partitions of the checks (judged once per set of plates, per layout; panel-only; web-only)
// come from the check registry: a new check is placed by its declared inputs, not by a list here.

/** The LTB screen for a set of plates, then a node for its layouts in ascending lower bound. */
export function judgePlates(s: SliceState, nd: PlatesNode): void {
  const { p, webs, pruned, L } = s;
  const { ps } = nd;
  const { plate, T, B, d } = ps;
  const nL = plate.layouts.length;
  if (prunes(s, d, nd.lb)) {
    pruned.incumbent += nL;
    return;
  }
  const section = buildSection(webs.at(plate.layouts[0]!), partOf(s, plate, 0), T, B);
  if (ltbPlatesFail(s, ps, section)) {
    pruned.lateralTorsional += nL;
    keepMiss(s, { key: [plate.layouts[0]!, ps.ti, ps.bi], section, depth: d, g: girderSelfWeight(section, s.supports), lb: nd.lb });
    return;
  }
  if (ps.fit && !p.load.reactionFloor && p.load.selfWeightFree) {
    // a load model without reactionFloor whose effects do not read g: the bearing floor from its reactions
    let R = 0;
    for (const r of p.load.effects(ps.gLo).reactions) R = Math.max(R, Math.abs(r.R));
    const fit = bearingFloorFor(s, plate, Math.min(T.b, B.b), R);
    if (fit === 'none') {
      pruned.bearing += nL;
      return;
    }
    ps.fit = fit;
  }
  // the layout-free checks wait until a layout has passed the others (judgeLayouts): past the
  // bounds and the LTB screen they rarely fail, and most sets never get that far; the effects
  // wait for the first layout judged (tens of kB each, which the collector would copy and keep)
  ps.section = section;
  // a plain array: read on every return of the node from the heap, with the node (no separate buffer)
  const lbs = doubles(nL);
  const kgPlates = flangeMass(T, L) + flangeMass(B, L);
  let order: Int32Array;
  if (s.isMass) {
    // the order of the layouts depends on the plates only through the bearing floor: cached
    const minB = Math.min(T.b, B.b);
    const key = ps.fit ? `${ps.fit.rigid.area}|${ps.fit['non-rigid'].area}` : `none:${minB}`;
    let hit = plate.orders.get(key);
    if (!hit) {
      const add = new Float64Array(nL);
      for (let j = 0; j < nL; j++) {
        const w = webs.at(plate.layouts[j]!);
        const b = bearingFloorOf(s, ps, j);
        add[j] = partOf(s, plate, j).stiffMass + b[w.endPost].area * w.hw * KG_PER_MM3;
      }
      const idx = Array.from({ length: nL }, (_, j) => j);
      idx.sort((x, y) => add[x]! - add[y]! || plate.layouts[x]! - plate.layouts[y]!);
      hit = { order: Int32Array.from(idx), add };
      plate.orders.set(key, hit);
    }
    // a lower bound by a hair (summed in another order than the exact mass): never above it
    const base = plate.webMass + kgPlates;
    for (let j = 0; j < nL; j++) lbs[j] = (base + hit.add[j]!) * (1 - 1e-12);
    order = hit.order;
  } else {
    const idx: number[] = [];
    for (let j = 0; j < nL; j++) {
      const w = webs.at(plate.layouts[j]!);
      lbs[j] = priceCost(s.prep, w, partOf(s, plate, j), T, B, bearingFloorOf(s, ps, j), s.minThroat);
      idx.push(j);
    }
    idx.sort((x, y) => lbs[x]! - lbs[y]! || plate.layouts[x]! - plate.layouts[y]!);
    order = Int32Array.from(idx);
  }
  ps.order = order;
  ps.lbs = lbs;
  if (order.length > 0) s.heap.push({ kind: 2, lb: lbs[order[0]!]!, seq: s.seq++, ps });
}

/** How far (relative) a layout's bound may pass the heap's least before its set goes back to the heap: fewer returns, each a cache miss on the set (only the order changes). */
const LAYOUT_SLACK = 0.01;

/** The layout checks for the next layouts of a set of plates, in ascending lower bound. */
export function judgeLayouts(s: SliceState, nd: LayoutsNode): void {
  const { p, o, webs, pruned, heap, L, failedBy } = s;
  const { ps } = nd;
  const { plate, T, B, d } = ps;
  const order = ps.order!;
  const lbs = ps.lbs!;
  while (ps.k < order.length) {
    const j = order[ps.k]!;
    const lb = lbs[j]!;
    if (prunes(s, d, lb)) {
      pruned.incumbent += order.length - ps.k;
      ps.k = order.length;
      return;
    }
    if (lb > heap.peekLb() * (1 + LAYOUT_SLACK)) {
      nd.lb = lb;
      heap.push(nd);
      return;
    }
    ps.k++;
    const wi = plate.layouts[j]!;
    const w = webs.at(wi);
    if (s.webDead.has(wi) || flatFailsTorsion(s, w)) {
      pruned.webOnly++;
      continue;
    }
    // with load-bearing stiffeners no force is patch loading (6, 7.2)
    if (!w.load && !panelOk(s, ps, w.panels)) {
      pruned.patchLoading++;
      continue;
    }
    // panels, load-bearing stiffeners or not, and end post (the panel-only checks read nothing else of the layout, and the loads)
    const panelKey = 4 * w.panels + (w.load ? 2 : 0) + (w.endPost === 'rigid' ? 1 : 0);
    const parts = partOf(s, plate, j);
    const section = buildSection(w, parts, T, B);
    // the layout's own self-weight, as `check` adds it: its verdict reads nothing else
    const g = girderSelfWeight(section, s.supports);
    const key: CandidateKey = [wi, ps.ti, ps.bi];
    if (ps.panelDead?.get(g)?.has(panelKey)) {
      pruned.sameFlanges++;
      continue;
    }
    if (ltbFailsAt(s, ps, g)) {
      pruned.lateralTorsional++;
      keepMiss(s, { key, section, depth: d, g, lb });
      continue;
    }
    const judged: Judged = { results: [] };
    const known = ps.panelPassed?.get(g)?.get(panelKey);
    if (ps.effectsG !== g) {
      ps.effects = p.load.effects(g);
      ps.effectsG = g;
    }
    const effects = ps.effects!;
    const fail = firstFailureAmong(section, effects, o, LAYOUT_IDS, judged, known);
    // the panel-only checks that passed here pass, with the same results, on every flat and side of the same self-weight
    for (const r of judged.results) {
      if (!PANEL_ONLY.has(r.id) || !r.passes || known?.has(r.id)) continue;
      const byG = (ps.panelPassed ??= new Map());
      let atG = byG.get(g);
      if (!atG) byG.set(g, (atG = new Map()));
      let got = atG.get(panelKey);
      if (!got) atG.set(panelKey, (got = new Map()));
      got.set(r.id, r);
    }
    // each layout judged completes a judgement (the plates' part is judged once per self-weight);
    // layouts dropped before it are counted under their reason, so every candidate counts once
    ps.layoutCalls++;
    s.fullEvaluations++;
    if (fail === null) {
      // the layout-free checks, once per self-weight of these plates, now that a layout needs their verdict
      const plateResults = (ps.plateResults ??= new Map());
      let got = plateResults.get(g);
      if (got === undefined) {
        const pj: Judged = { results: [] };
        const plateFail = firstFailureAmong(ps.section!, effects, o, PLATE_IDS, pj);
        got = plateFail ?? pj.results;
        plateResults.set(g, got);
      }
      if (!Array.isArray(got)) {
        // it fails every layout of these plates with this self-weight (the others are judged at their own)
        const plateFail = got as CheckResult;
        failedBy[plateFail.id] = (failedBy[plateFail.id] ?? 0) + 1;
        keepMiss(s, { key, section, depth: d, g, lb });
        continue;
      }
      // both parts passed: together they are checkGirder's verdict (a property test keeps them equal)
      const verdict = assembleVerdict([...got, ...judged.results], judged.bearing!, judged.bearingSized!);
      const plates = parts.webMass + parts.stiffMass + (flangeMass(T, L) + flangeMass(B, L));
      const { mass, value } = settle(s.prep, w, parts, T, B, plates, verdict, s.throat0);
      admit(s, { key, section: { ...section, bearing: verdict.bearing }, depth: d, mass, value, verdict });
      continue;
    }
    failedBy[fail.id] = (failedBy[fail.id] ?? 0) + 1;
    keepMiss(s, { key, section, depth: d, g, lb });
    if (failsWebOnly(fail)) s.webDead.add(wi);
    else if (PANEL_ONLY.has(fail.id)) {
      const byG = (ps.panelDead ??= new Map());
      let dead = byG.get(g);
      if (!dead) byG.set(g, (dead = new Set()));
      dead.add(panelKey);
    }
  }
}
