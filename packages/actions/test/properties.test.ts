/**
 * Property tests of the beam analysis and the combination machinery (fast-check). These check
 * general mechanics (equilibrium, dM/dx = V, slope continuity over supports, superposition,
 * symmetry, exactness of the station-wise pattern envelope against brute force); they are not
 * validation against a published source (that is in test/validation/actions-*.test.ts).
 * Tolerances: 1e-9 relative to the problem's scale (floating-point only).
 */
import { describe, expect } from 'vitest';
import { fc, test } from '@fast-check/vitest';
import {
  analyse,
  continuousBeam,
  designEffects,
  type ActionSpec,
  type BeamLoad,
  type BeamProblem,
  type DesignEffects,
} from '@platesmith/actions';

const spansArb = fc.array(fc.integer({ min: 1000, max: 30000 }), { minLength: 1, maxLength: 4 });

/** loads on a beam of length Ltot, from unit fractions */
const loadArb = fc.oneof(
  fc.record({ type: fc.constant('point' as const), P: fc.double({ min: -2e5, max: 5e5, noNaN: true }), u: fc.double({ min: 0, max: 1, noNaN: true }) }),
  fc.record({
    type: fc.constant('udl' as const),
    w: fc.double({ min: -20, max: 50, noNaN: true }),
    u: fc.double({ min: 0, max: 0.99, noNaN: true }),
    v: fc.double({ min: 0.001, max: 1, noNaN: true }),
  }),
);

function place(Ltot: number, l: { type: 'point'; P: number; u: number } | { type: 'udl'; w: number; u: number; v: number }): BeamLoad {
  if (l.type === 'point') return { type: 'point', P: l.P, at: Math.round(l.u * Ltot) };
  const from = Math.round(l.u * Ltot);
  const to = Math.min(Ltot, from + Math.max(1, Math.round(l.v * (Ltot - from))));
  return { type: 'udl', w: l.w, from, to: to > from ? to : Ltot };
}

function total(loads: BeamLoad[]): { F: number; scale: number } {
  let F = 0;
  let scale = 1;
  for (const l of loads) {
    const f = l.type === 'point' ? l.P : l.w * (l.to - l.from);
    F += f;
    scale += Math.abs(f);
  }
  return { F, scale };
}

describe('continuousBeam', () => {
  test.prop([spansArb, fc.array(loadArb, { minLength: 1, maxLength: 5 })])('equilibrium: reactions sum to the loads, moments about the left end balance', (spans, raw) => {
    const b = continuousBeam(spans, []);
    const Ltot = b.supports[b.supports.length - 1]!;
    const loads = raw.map((l) => place(Ltot, l));
    const s = continuousBeam(spans, loads);
    const { F, scale } = total(loads);
    const sumR = s.reactions.reduce((a, r) => a + r, 0);
    expect(Math.abs(sumR - F)).toBeLessThanOrEqual(1e-9 * scale);
    let mLoads = 0;
    for (const l of loads) mLoads += l.type === 'point' ? l.P * l.at : l.w * (l.to - l.from) * ((l.from + l.to) / 2);
    const mR = s.reactions.reduce((a, r, j) => a + r * s.supports[j]!, 0);
    expect(Math.abs(mR - mLoads)).toBeLessThanOrEqual(1e-9 * scale * Ltot);
  });

  test.prop([spansArb, fc.array(loadArb, { minLength: 1, maxLength: 5 }), fc.double({ min: 0, max: 1, noNaN: true })])(
    'dM/dx = V: M(x) equals the integral of V from 0 (V is linear between load breakpoints)',
    (spans, raw, u) => {
      const Ltot = spans.reduce((a, b) => a + b, 0);
      const loads = raw.map((l) => place(Ltot, l));
      const s = continuousBeam(spans, loads);
      const x = u * Ltot;
      const bps = new Set<number>([0, x, ...s.supports]);
      for (const l of loads) {
        if (l.type === 'point') bps.add(l.at);
        else {
          bps.add(l.from);
          bps.add(l.to);
        }
      }
      const pts = [...bps].filter((p) => p <= x).sort((a, b) => a - b);
      let integral = 0;
      for (let i = 0; i + 1 < pts.length; i++) {
        const p = pts[i]!;
        const q = pts[i + 1]!;
        integral += ((s.V(p, 1) + s.V(q, -1)) / 2) * (q - p);
      }
      const { scale } = total(loads);
      expect(Math.abs(s.M(x) - integral)).toBeLessThanOrEqual(1e-9 * scale * Ltot);
    },
  );

  test.prop([fc.array(fc.integer({ min: 2000, max: 30000 }), { minLength: 2, maxLength: 4 }), fc.array(loadArb, { minLength: 1, maxLength: 4 })])(
    'compatibility: zero deflection at every support and a continuous slope over interior supports',
    (spans, raw) => {
      const Ltot = spans.reduce((a, b) => a + b, 0);
      const loads = raw.map((l) => place(Ltot, l));
      const s = continuousBeam(spans, loads);
      const { scale } = total(loads);
      const Lmax = Math.max(...spans);
      const vScale = scale * Lmax ** 3; // E·I·δ scale
      for (const xj of s.supports) expect.soft(Math.abs(s.EIdelta(xj))).toBeLessThanOrEqual(1e-9 * vScale);
      for (let j = 1; j < s.supports.length - 1; j++) {
        const xj = s.supports[j]!;
        const h = 0.5;
        // one-sided slopes; their O(h·M) error is far below the tolerance
        const left = (s.EIdelta(xj) - s.EIdelta(xj - h)) / h;
        const right = (s.EIdelta(xj + h) - s.EIdelta(xj)) / h;
        expect.soft(Math.abs(left - right)).toBeLessThanOrEqual(1e-6 * scale * Lmax ** 2 + 2 * h * scale);
      }
    },
  );
});

// ---- analyse / designEffects

const actionArb: fc.Arbitrary<(L: number) => ActionSpec> = fc.oneof(
  fc.record({ kind: fc.constantFrom('permanent' as const, 'variable' as const), value: fc.double({ min: -10, max: 40, noNaN: true }) }).map(
    (r) => (_L: number): ActionSpec => ({ kind: r.kind, load: 'udl', value: r.value, psi0: 0.7, psi1: 0.5, psi2: 0.3 }),
  ),
  fc.record({ kind: fc.constantFrom('permanent' as const, 'variable' as const), value: fc.double({ min: -10, max: 40, noNaN: true }), u: fc.double({ min: 0, max: 0.8, noNaN: true }), v: fc.double({ min: 0.05, max: 1, noNaN: true }) }).map(
    (r) => (L: number): ActionSpec => {
      const from = Math.round(r.u * L);
      const to = Math.max(from + 1, Math.round(from + r.v * (L - from)));
      return { kind: r.kind, load: 'partial-udl', value: r.value, from, to: Math.min(L, to), category: 'C' };
    },
  ),
  fc.record({ kind: fc.constantFrom('permanent' as const, 'variable' as const), value: fc.double({ min: -1e5, max: 4e5, noNaN: true }), u: fc.double({ min: 0.01, max: 0.99, noNaN: true }) }).map(
    (r) => (L: number): ActionSpec => ({ kind: r.kind, load: 'point', value: r.value, at: Math.round(r.u * L), category: 'wind' }),
  ),
);

const problemArb = fc
  .record({
    spans: fc.array(fc.integer({ min: 3000, max: 25000 }), { minLength: 1, maxLength: 3 }),
    actions: fc.array(actionArb, { minLength: 1, maxLength: 4 }),
    combination: fc.constantFrom('6.10' as const, '6.10ab' as const),
  })
  .map((r): BeamProblem => {
    const L = r.spans.reduce((a, b) => a + b, 0);
    return { spans: r.spans, actions: r.actions.map((f) => f(L)), combination: r.combination, gridDivisions: 10 };
  });

/** per station key: [max M, min M, max |V|] */
function envelopeByStation(e: DesignEffects): Map<string, [number, number, number]> {
  const m = new Map<string, [number, number, number]>();
  e.stations.forEach((s) => {
    const k = String(s.x);
    const cur = m.get(k) ?? [-Infinity, Infinity, 0];
    m.set(k, [Math.max(cur[0], s.MEd), Math.min(cur[1], s.MEd), Math.max(cur[2], Math.abs(s.VEd))]);
  });
  return m;
}

function scaleOf(p: BeamProblem, g: number): number {
  const L = p.spans.reduce((a, b) => a + b, 0);
  let s = Math.abs(g) * L + 1;
  for (const a of p.actions) s += Math.abs(a.value) * (a.load === 'point' ? 1 : L);
  return s;
}

describe('designEffects', () => {
  test.prop([problemArb, fc.double({ min: 0, max: 30, noNaN: true })], { numRuns: 60 })(
    'superposition: adding g in designEffects equals analysing with g as an explicit permanent UDL',
    (p, g) => {
      const a = designEffects(analyse(p), g);
      const b = designEffects(analyse({ ...p, actions: [...p.actions, { kind: 'permanent', load: 'udl', value: g }] }), 0);
      const L = p.spans.reduce((x, y) => x + y, 0);
      const tolF = 1e-9 * scaleOf(p, g);
      const tolM = tolF * L;
      const ea = envelopeByStation(a);
      const eb = envelopeByStation(b);
      let shared = 0;
      for (const [k, va] of ea) {
        const vb = eb.get(k);
        if (vb === undefined) continue; // zero-shear stations depend on the load set
        shared++;
        expect.soft(Math.abs(va[0] - vb[0]), `max M at ${k}`).toBeLessThanOrEqual(tolM);
        expect.soft(Math.abs(va[1] - vb[1]), `min M at ${k}`).toBeLessThanOrEqual(tolM);
        expect.soft(Math.abs(va[2] - vb[2]), `max |V| at ${k}`).toBeLessThanOrEqual(tolF);
      }
      expect(shared).toBeGreaterThan(p.spans.length * 8);
      a.reactions.forEach((r, i) => expect.soft(Math.abs(r.R - b.reactions[i]!.R)).toBeLessThanOrEqual(tolF));
      a.sls.forEach((d, i) => {
        const pb = new Map(b.sls[i]!.points.filter((q, j, arr) => j === 0 || arr[j - 1]!.x !== q.x).map((q) => [q.x, q]));
        for (const q of d.points.filter((q, j, arr) => j === 0 || arr[j - 1]!.x !== q.x)) {
          const r = pb.get(q.x);
          if (r === undefined) continue;
          expect.soft(Math.abs(q.bend - r.bend)).toBeLessThanOrEqual(tolM * L * L);
          expect.soft(Math.abs(q.shear - r.shear)).toBeLessThanOrEqual(tolM);
        }
      });
    },
  );

  test.prop([
    fc.array(fc.integer({ min: 3000, max: 25000 }), { minLength: 1, maxLength: 2 }),
    fc.double({ min: 0, max: 30, noNaN: true }),
    fc.double({ min: -10, max: 40, noNaN: true }),
    fc.double({ min: 0, max: 3e5, noNaN: true }),
    fc.double({ min: 0, max: 30, noNaN: true }),
  ])('symmetry: a symmetric problem has a mirror-symmetric envelope and reactions', (half, G, Q, P, g) => {
    const spans = [...half, ...[...half].reverse()];
    const L = spans.reduce((a, b) => a + b, 0);
    const p: BeamProblem = {
      spans,
      actions: [
        { kind: 'permanent', load: 'udl', value: G },
        { kind: 'variable', load: 'udl', value: Q, category: 'B' },
        { kind: 'variable', load: 'point', value: P, at: L / 4, category: 'E' },
        { kind: 'variable', load: 'point', value: P, at: (3 * L) / 4, category: 'E' },
      ],
      combination: '6.10',
      gridDivisions: 8,
    };
    const e = designEffects(analyse(p), g);
    const env = envelopeByStation(e);
    const tol = 1e-9 * scaleOf(p, g) * L;
    for (const [k, v] of env) {
      const m = env.get(String(L - Number(k)));
      if (m === undefined) continue;
      expect.soft(Math.abs(v[0] - m[0]), `max M at ${k}`).toBeLessThanOrEqual(tol);
      expect.soft(Math.abs(v[1] - m[1]), `min M at ${k}`).toBeLessThanOrEqual(tol);
    }
    const R = e.reactions.map((r) => r.R);
    R.forEach((r, i) => expect.soft(Math.abs(r - R[R.length - 1 - i]!)).toBeLessThanOrEqual(tol / L));
  });

  test.prop([
    fc.array(fc.integer({ min: 3000, max: 20000 }), { minLength: 1, maxLength: 3 }),
    fc.double({ min: -5, max: 20, noNaN: true }),
    fc.double({ min: -15, max: 30, noNaN: true }),
    fc.double({ min: -1e5, max: 3e5, noNaN: true }),
    fc.double({ min: 0, max: 1, noNaN: true }),
  ], { numRuns: 40 })('pattern envelope equals brute force over every span-by-span pattern (eq. 6.10)', (spans, G, Q, P, u) => {
    const L = spans.reduce((a, b) => a + b, 0);
    const at = Math.round(u * L);
    const p: BeamProblem = {
      spans,
      actions: [
        { kind: 'permanent', load: 'udl', value: G },
        { kind: 'variable', load: 'udl', value: Q, psi0: 0.6, psi1: 0.5, psi2: 0.2 },
        { kind: 'variable', load: 'point', value: P, at, psi0: 0.7, psi1: 0.5, psi2: 0.3 },
      ],
      combination: '6.10',
      gridDivisions: 6,
    };
    const e = designEffects(analyse(p), 0);
    const x0 = [0];
    for (const s of spans) x0.push(x0[x0.length - 1]! + s);
    // brute force: γG ∈ {1.35, 1.0}, lead ∈ {UDL, point}, each span part of the UDL on/off, point on/off
    const cases: BeamLoad[][] = [];
    const n = spans.length;
    for (const gG of [1.35, 1.0]) {
      for (const lead of [0, 1]) {
        const fQ = lead === 0 ? 1.5 : 1.5 * 0.6;
        const fP = lead === 1 ? 1.5 : 1.5 * 0.7;
        for (let mask = 0; mask < 1 << (n + 1); mask++) {
          const loads: BeamLoad[] = [{ type: 'udl', w: gG * G, from: 0, to: L }];
          for (let s = 0; s < n; s++) if (mask & (1 << s)) loads.push({ type: 'udl', w: fQ * Q, from: x0[s]!, to: x0[s + 1]! });
          if (mask & (1 << n)) loads.push({ type: 'point', P: fP * P, at });
          cases.push(loads);
        }
      }
    }
    const sols = cases.map((c) => continuousBeam(spans, c));
    const env = envelopeByStation(e);
    const tol = 1e-9 * scaleOf(p, 0) * L;
    for (const [k] of env) {
      const x = Number(k);
      const Ms = sols.map((s) => s.M(x));
      expect.soft(Math.abs(env.get(k)![0] - Math.max(...Ms)), `max M at ${x}`).toBeLessThanOrEqual(tol);
      expect.soft(Math.abs(env.get(k)![1] - Math.min(...Ms)), `min M at ${x}`).toBeLessThanOrEqual(tol);
      const Vs = sols.flatMap((s) => (x > 0 ? [s.V(x, -1)] : []).concat(x < L ? [s.V(x, 1)] : []));
      expect.soft(Math.abs(env.get(k)![2] - Math.max(...Vs.map(Math.abs))), `max |V| at ${x}`).toBeLessThanOrEqual(tol / L);
    }
    const R = e.reactions.map((r) => r.R);
    R.forEach((r, j) => expect.soft(Math.abs(r - Math.max(...sols.map((s) => s.reactions[j]!)))).toBeLessThanOrEqual(tol / L));
  });
});
