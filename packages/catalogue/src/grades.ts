import { DomainError } from './errors.js';

/**
 * Structural steel grades and their strengths by nominal thickness.
 *
 * - S235, S275, S355: EN 10025-2:2004 Table 7 (ReH minimum yield strength) and Table 7
 *   (Rm tensile strength, lower bound of the range). S275 and S355 rows were read in
 *   published copies (SCI P363 explanatory notes; a steelmaker's S355 datasheet); the
 *   S235 row is from memory.
 * - S420, S460: EN 10025-4:2004 (thermomechanically rolled M/ML plate), from memory;
 *   the S460 yield row agrees with a published SCI explanatory note.
 * - The EN 1993-1-1:2005 Table 3.1 simplified two-band values (t <= 40, 40 < t <= 80)
 *   are offered as the alternative fy source. Table 3.1's fu for S355, t <= 40 is taken
 *   as 490 MPa (later printings; early ones said 510) — from memory.
 *
 * Band edges belong to the thinner band: t = 16.0 mm uses the "t <= 16" value.
 * Units: thickness mm, strengths N/mm² (MPa).
 */
export type GradeName = 'S235' | 'S275' | 'S355' | 'S420' | 'S460';
export const GRADES: readonly GradeName[] = ['S235', 'S275', 'S355', 'S420', 'S460'];

/** 'product': the product standard's thickness bands (default). 'table3.1': EN 1993-1-1 Table 3.1. */
export type FySource = 'product' | 'table3.1';

interface Band {
  /** upper bound of the band, inclusive, mm */
  tMax: number;
  fy: number;
  fu: number;
}

interface GradeData {
  name: GradeName;
  standard: string;
  product: Band[];
  table31: Band[];
  /** correlation factor for fillet welds, EN 1993-1-8 Table 4.1 */
  betaW: number;
}

const DATA: Record<GradeName, GradeData> = {
  S235: {
    name: 'S235',
    standard: 'EN 10025-2',
    product: [
      { tMax: 16, fy: 235, fu: 360 },
      { tMax: 40, fy: 225, fu: 360 },
      { tMax: 63, fy: 215, fu: 360 },
      { tMax: 80, fy: 215, fu: 360 },
      { tMax: 100, fy: 215, fu: 360 },
      { tMax: 150, fy: 195, fu: 350 },
    ],
    table31: [
      { tMax: 40, fy: 235, fu: 360 },
      { tMax: 80, fy: 215, fu: 360 },
    ],
    betaW: 0.8,
  },
  S275: {
    name: 'S275',
    standard: 'EN 10025-2',
    product: [
      { tMax: 16, fy: 275, fu: 410 },
      { tMax: 40, fy: 265, fu: 410 },
      { tMax: 63, fy: 255, fu: 410 },
      { tMax: 80, fy: 245, fu: 410 },
      { tMax: 100, fy: 235, fu: 410 },
      { tMax: 150, fy: 225, fu: 400 },
    ],
    table31: [
      { tMax: 40, fy: 275, fu: 430 },
      { tMax: 80, fy: 255, fu: 410 },
    ],
    betaW: 0.85,
  },
  S355: {
    name: 'S355',
    standard: 'EN 10025-2',
    product: [
      { tMax: 16, fy: 355, fu: 470 },
      { tMax: 40, fy: 345, fu: 470 },
      { tMax: 63, fy: 335, fu: 470 },
      { tMax: 80, fy: 325, fu: 470 },
      { tMax: 100, fy: 315, fu: 470 },
      { tMax: 150, fy: 295, fu: 450 },
    ],
    table31: [
      { tMax: 40, fy: 355, fu: 490 },
      { tMax: 80, fy: 335, fu: 470 },
    ],
    betaW: 0.9,
  },
  S420: {
    name: 'S420',
    standard: 'EN 10025-4',
    product: [
      { tMax: 16, fy: 420, fu: 520 },
      { tMax: 40, fy: 400, fu: 520 },
      { tMax: 63, fy: 390, fu: 500 },
      { tMax: 80, fy: 380, fu: 480 },
      { tMax: 100, fy: 370, fu: 470 },
      { tMax: 120, fy: 365, fu: 460 },
    ],
    table31: [
      { tMax: 40, fy: 420, fu: 520 },
      { tMax: 80, fy: 390, fu: 500 },
    ],
    betaW: 1.0,
  },
  S460: {
    name: 'S460',
    standard: 'EN 10025-4',
    product: [
      { tMax: 16, fy: 460, fu: 540 },
      { tMax: 40, fy: 440, fu: 540 },
      { tMax: 63, fy: 430, fu: 530 },
      { tMax: 80, fy: 410, fu: 510 },
      { tMax: 100, fy: 400, fu: 500 },
      { tMax: 120, fy: 385, fu: 490 },
    ],
    table31: [
      { tMax: 40, fy: 460, fu: 540 },
      { tMax: 80, fy: 430, fu: 530 },
    ],
    betaW: 1.0,
  },
};

export function isGradeName(s: unknown): s is GradeName {
  return typeof s === 'string' && (GRADES as readonly string[]).includes(s);
}

function gradeData(grade: string, field?: string): GradeData {
  if (!isGradeName(grade)) {
    throw new DomainError(
      'UNKNOWN_GRADE',
      `unknown steel grade "${grade}"`,
      `use one of ${GRADES.join(', ')}`,
      field,
      { grade },
    );
  }
  return DATA[grade];
}

function band(grade: string, t: number, source: FySource, field?: string): Band {
  const g = gradeData(grade, field);
  const bands = source === 'table3.1' ? g.table31 : g.product;
  const tMax = bands[bands.length - 1]!.tMax;
  if (!Number.isFinite(t) || t <= 0 || t > tMax) {
    const where = source === 'table3.1' ? 'EN 1993-1-1 Table 3.1' : g.standard;
    throw new DomainError(
      'THICKNESS_OUT_OF_RANGE',
      `${grade} plate ${t} mm thick is outside ${where} (0 < t <= ${tMax} mm)`,
      source === 'table3.1' && t <= g.product[g.product.length - 1]!.tMax
        ? `use fySource "product" for plates thicker than ${tMax} mm, or a thinner plate`
        : `choose a plate no thicker than ${tMax} mm`,
      field,
      { grade, t, tMax, source },
    );
  }
  for (const b of bands) if (t <= b.tMax) return b;
  /* c8 ignore next */
  throw new Error('unreachable');
}

/** Yield strength fy (MPa) of a plate of nominal thickness t (mm). */
export function fy(grade: string, t: number, source: FySource = 'product', field?: string): number {
  return band(grade, t, source, field).fy;
}

/** Ultimate tensile strength fu (MPa), the lower bound of the product standard's range. */
export function fu(grade: string, t: number, source: FySource = 'product', field?: string): number {
  return band(grade, t, source, field).fu;
}

/** Largest thickness (mm) the chosen fy source covers for the grade. */
export function maxThickness(grade: string, source: FySource = 'product'): number {
  const g = gradeData(grade);
  const bands = source === 'table3.1' ? g.table31 : g.product;
  return bands[bands.length - 1]!.tMax;
}

/** Thickness band edges (mm, inclusive upper bounds) where fy changes, ascending. */
export function bandEdges(grade: string, source: FySource = 'product'): number[] {
  const g = gradeData(grade);
  return (source === 'table3.1' ? g.table31 : g.product).map((b) => b.tMax);
}

/** Fillet-weld correlation factor βw, EN 1993-1-8 Table 4.1. */
export function betaW(grade: string): number {
  return gradeData(grade).betaW;
}

/** Highest fy (MPa) of the grade at any thickness: a bound for pruning. */
export function fyMax(grade: string, source: FySource = 'product'): number {
  const g = gradeData(grade);
  return Math.max(...(source === 'table3.1' ? g.table31 : g.product).map((b) => b.fy));
}

export function assertGrade(grade: string, field?: string): GradeName {
  return gradeData(grade, field).name;
}
