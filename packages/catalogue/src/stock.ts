/**
 * Default stocks of plate and flat bar a fabricator can usually buy.
 * Common practice, no source: typical mill plate thicknesses and hot-rolled flat sizes
 * held by European stockholders. Projects override them with their own lists.
 * Units: mm.
 */
export const PLATE_THICKNESSES: readonly number[] = [
  6, 8, 10, 12, 15, 18, 20, 25, 30, 35, 40, 45, 50, 55, 60, 65, 70, 80, 90, 100,
];

export interface FlatBar {
  /** width (outstand from the web), mm */
  b: number;
  /** thickness, mm */
  t: number;
}

export const FLAT_BARS: readonly FlatBar[] = [
  { b: 80, t: 8 },
  { b: 100, t: 10 },
  { b: 120, t: 10 },
  { b: 120, t: 12 },
  { b: 150, t: 12 },
  { b: 150, t: 15 },
  { b: 180, t: 15 },
  { b: 200, t: 15 },
  { b: 200, t: 20 },
  { b: 250, t: 20 },
  { b: 250, t: 25 },
  { b: 300, t: 25 },
];

/** Fillet-weld throat sizes a (mm) offered by default. Common practice, no source. */
export const WELD_THROATS: readonly number[] = [3, 4, 5, 6, 7, 8, 10, 12];

/** Steel density, kg/m³ (EN 1991-1-1 Table A.4 gives 77–78.5 kN/m³; 7850 kg/m³ is the usual value). */
export const STEEL_DENSITY = 7850;

/**
 * Steel density in kg per mm³: every mass in the project (objective, self-weight, tonnage, the
 * search's bounds) uses this one constant, so a bound and the exact value it bounds agree to the
 * bit. (Written as the product: 7850 × 1e-9 is one unit in the last place above the literal 7.85e-6.)
 */
export const STEEL_KG_PER_MM3 = STEEL_DENSITY * 1e-9;

/** Standard acceleration of gravity, N per kg (9.80665 m/s², exact by definition: CGPM 1901). */
export const G_ACC = 9.80665;
