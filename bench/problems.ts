/**
 * Reference problems for the benchmark: scenarios of our own, invented for this purpose (no real
 * project). Spaces are large on purpose (≥ 1e7 candidates; the mono-symmetric one ≥ 1e10).
 */
const range = (a: number, b: number, s: number) => ({ min: a, max: b, step: s });

/** A 20 m industrial girder carrying two column loads (invented). */
const INDUSTRIAL_20M = {
  spans: [20000],
  actions: [
    { kind: 'permanent', load: 'udl', value: 12 },
    { kind: 'variable', load: 'udl', value: 15, category: 'E' },
    { kind: 'permanent', load: 'point', value: 260, at: 7000, ss: 200 },
    { kind: 'variable', load: 'point', value: 310, at: 7000, ss: 200, category: 'E' },
    { kind: 'permanent', load: 'point', value: 260, at: 13000, ss: 200 },
    { kind: 'variable', load: 'point', value: 310, at: 13000, ss: 200, category: 'E' },
  ],
  // restraints pinned: each problem keeps the meaning it had when its figures were first taken
  options: { restraint: { spacing: 5000 }, bottomRestraint: 'supports' },
};

export const PROBLEMS: { name: string; input: Record<string, unknown>; small: Record<string, unknown> }[] = [
  {
    name: 'industrial-20m-point-loads',
    input: {
      ...INDUSTRIAL_20M,
      space: {
        webDepth: range(800, 2400, 50),
        webThickness: [8, 10, 12, 15, 20],
        flangeWidth: range(250, 700, 25),
        flangeThickness: [15, 20, 25, 30, 35, 40, 50],
        panels: { min: 0, max: 16 },
        stiffenerSides: 'both',
        maxDepth: 2500,
      },
    },
    small: { webDepth: range(900, 1500, 100), webThickness: [10, 12, 15], flangeWidth: range(400, 700, 50), flangeThickness: [25, 30, 35, 40], panels: [0, 4, 8], flats: [{ width: 120, thickness: 12 }] },
  },
  {
    name: 'roof-36m-simply-supported',
    input: {
      spans: [36000],
      actions: [
        { kind: 'permanent', load: 'udl', value: 9.5 },
        { kind: 'variable', load: 'udl', value: 7.2, category: 'snow' },
        { kind: 'variable', load: 'udl', value: 3.0, category: 'H' },
      ],
      combination: '6.10ab',
      options: { restraint: { spacing: 4000 }, bottomRestraint: 'supports' },
      space: {
        webDepth: range(1200, 2800, 50),
        webThickness: [8, 10, 12, 15, 20],
        flangeWidth: range(250, 700, 25),
        flangeThickness: [15, 20, 25, 30, 35, 40, 50],
        panels: { min: 0, max: 16 },
        stiffenerSides: 'both',
        maxDepth: 3000,
      },
    },
    small: { webDepth: range(1400, 2200, 100), webThickness: [8, 10, 12], flangeWidth: range(300, 600, 50), flangeThickness: [20, 25, 30, 35], panels: [0, 6, 12], flats: [{ width: 100, thickness: 10 }] },
  },
  {
    name: 'continuous-3-span-50m-main',
    input: {
      spans: [40000, 50000, 40000],
      actions: [
        { kind: 'permanent', load: 'udl', value: 14 },
        { kind: 'variable', load: 'udl', value: 18, psi0: 0.8, psi1: 0.7, psi2: 0.5 },
      ],
      options: { factors: 'bridges', restraint: { spacing: 6250 }, bottomRestraint: { spacing: 6250 } },
      space: {
        webDepth: range(1600, 3200, 50),
        webThickness: [10, 12, 15, 18, 20, 25],
        flangeWidth: range(400, 900, 25),
        flangeThickness: [20, 25, 30, 35, 40, 50, 60],
        panels: { min: 0, max: 16 },
        maxDepth: 3400,
      },
    },
    small: { webDepth: range(2000, 2800, 100), webThickness: [12, 15, 18], flangeWidth: range(500, 800, 50), flangeThickness: [30, 40, 50, 60], panels: [0, 8, 16], flats: [{ width: 150, thickness: 15 }] },
  },
  {
    name: 'industrial-20m-mono-symmetric',
    input: {
      ...INDUSTRIAL_20M,
      space: {
        symmetric: false,
        webDepth: range(800, 2400, 50),
        webThickness: [8, 10, 12, 15, 18, 20],
        flangeWidth: range(250, 750, 25),
        flangeThickness: [12, 15, 18, 20, 22, 25, 30, 35, 40, 45, 50, 55, 60],
        panels: { min: 0, max: 16 },
        stiffenerSides: 'both',
        maxDepth: 2500,
      },
    },
    small: { symmetric: false, webDepth: range(1000, 1500, 100), webThickness: [10, 12], flangeWidth: range(400, 700, 100), flangeThickness: [25, 30, 40], panels: [0, 4], flats: [{ width: 120, thickness: 12 }] },
  },
];
