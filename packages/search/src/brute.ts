import { checkGirder, girderSelfWeight } from '@platesmith/checks';
import { prepareSearch, price, settle, type BearingFlat, type Evaluated, type SearchProblem } from './core.js';
import { paretoFront } from './pareto.js';
import { buildSection, webParts } from './objective.js';
import { webConfigs } from './space.js';

/**
 * Exhaustive enumeration of the same space with the same check library and the same objective,
 * each candidate judged with its own self-weight (girderSelfWeight, as `check` adds it): the ground
 * truth the search is tested against. Only for small spaces.
 */
export function bruteForce(p: SearchProblem): { front: Evaluated[]; evaluations: number; feasible: number } {
  const prep = prepareSearch(p);
  const { flanges, L, Lmax, supports } = prep;
  // the configurations built one by one (webConfigs), not read from the search's table: the indices agree (a test keeps them equal)
  const webs = webConfigs(p.space, prep.fySource);
  const sp = p.space;
  const minThroat = p.options.weldThroats[0]!;
  const feasible: Evaluated[] = [];
  let evaluations = 0;
  // the concentrated forces' positions (load-bearing stiffeners stand under each of them), from the load model itself
  const forceXs = p.load.effects(0).forces.map((f) => f.x);
  // the restraint stiffener pairs the space puts on every candidate (at the options' restraint positions)
  const f = sp.restraintStiffener;
  const at = [...(p.options.restraint.kind === 'at' ? p.options.restraint.at : []), ...(p.options.restraintBottom.kind === 'at' ? p.options.restraintBottom.at : [])];
  const restraint = f ? { bs: f.b, ts: f.t, xs: at } : null;
  webs.forEach((w, wi) => {
    const parts = webParts(w, L, supports, Lmax, forceXs, restraint);
    const cache = new Map<number, BearingFlat>();
    for (let ti = 0; ti < flanges.length; ti++) {
      for (let bi = 0; bi < flanges.length; bi++) {
        if (sp.symmetric && bi !== ti) continue;
        const T = flanges[ti]!;
        const B = flanges[bi]!;
        const d = w.hw + T.t + B.t;
        if (d < sp.minDepth || d > sp.maxDepth) continue;
        if (sp.rules.tfMaxOverTw !== undefined && (T.t > sp.rules.tfMaxOverTw * w.tw || B.t > sp.rules.tfMaxOverTw * w.tw)) continue;
        const section = buildSection(w, parts, T, B);
        const { plates } = price(prep, w, parts, T, B, cache, minThroat);
        const verdict = checkGirder(section, p.load.effects(girderSelfWeight(section, supports)), p.options);
        evaluations++;
        if (!verdict.passes) continue;
        const { mass, value } = settle(prep, w, parts, T, B, plates, verdict, minThroat);
        feasible.push({ key: [wi, ti, bi], section: { ...section, bearing: verdict.bearing }, depth: d, mass, value, verdict });
      }
    }
  });
  return { front: paretoFront(feasible), evaluations, feasible: feasible.length };
}
