/**
 * The one place where units change. Public JSON uses the trade's units: lengths mm, forces kN,
 * distributed loads kN/m, moments kNm, stresses MPa, mass kg. Inside: N, mm, N/mm, N·mm.
 */
export const kN = 1e3; // N per kN
export const kNm = 1e6; // N·mm per kNm

export const toN = (kNvalue: number): number => kNvalue * kN;
export const toNmm = (kNmValue: number): number => kNmValue * kNm;
export const fromN = (N: number): number => N / kN;
export const fromNmm = (Nmm: number): number => Nmm / kNm;

/** Unit of each key a check may put in `values`, as published (after conversion). */
export type ValueUnit = 'kN' | 'kNm' | 'kN/m' | 'mm' | 'mm2' | 'mm3' | 'mm4' | 'MPa' | '-';

/** Internal-to-public conversion factor per public unit. */
const FACTOR: Record<ValueUnit, number> = {
  kN: 1 / kN,
  kNm: 1 / kNm,
  'kN/m': 1, // N/mm = kN/m
  mm: 1,
  mm2: 1,
  mm3: 1,
  mm4: 1,
  MPa: 1,
  '-': 1,
};

export function convertValue(unit: ValueUnit, v: number): number {
  return v * FACTOR[unit];
}
