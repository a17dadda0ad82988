/**
 * The invented schedule of `pnpm bench:schedule`: floor and roof girders of a logistics hall, drawn
 * by a seeded generator (every run is the same schedule). Invented data for the benchmark only.
 */
/** mulberry32: a small seeded generator (common practice, no source needed: any fixed PRNG will do). */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The invented project: floor and roof girders of a logistics hall, 6 to 18 m, one or two spans. */
export function benchSchedule(n: number, seed = 20261201): Record<string, unknown> {
  const r = rng(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(r() * xs.length)]!;
  const girders = Array.from({ length: n }, (_, i) => {
    const span = 6000 + 500 * Math.floor(r() * 25); // 6 … 18 m
    const two = r() < 0.2;
    const g = 5 + Math.round(r() * 150) / 10; // 5 … 20 kN/m
    const q = 5 + Math.round(r() * 200) / 10; // 5 … 25 kN/m
    return {
      mark: `H${String(i + 1).padStart(3, '0')}`,
      quantity: 1 + Math.floor(r() * 12),
      spans: two ? [span, Math.round((span * (0.6 + 0.4 * r())) / 100) * 100] : [span],
      actions: [
        { kind: 'permanent', load: 'udl', value: g },
        { kind: 'variable', load: 'udl', value: q, category: pick(['B', 'C', 'E'] as const) },
      ],
      options: { restraint: pick(['continuous', { spacing: 3000 }, { spacing: 4000 }] as const) },
    };
  });
  return {
    name: `invented logistics hall, ${n} marks`,
    defaults: {
      space: {
        webDepth: { min: 500, max: 1300, step: 100 },
        webThickness: [8, 10, 12],
        flangeWidth: { min: 200, max: 450, step: 50 },
        flangeThickness: [12, 15, 20, 25, 30],
        panels: [0, 4],
        endPost: 'rigid',
      },
    },
    tender: { rates: { S355: 1.4 } },
    girders,
  };
}

