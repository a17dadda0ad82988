import { DomainError, STEEL_KG_PER_MM3, type GradeName } from '@platesmith/catalogue';
import { bearingPairCount, loadStiffenerPositions, material, panelsOf, resolveBearing, restraintStiffenerPositions } from '@platesmith/checks';
import { toSection, type SectionJson } from '@platesmith/schema';

/**
 * One girder mark of a tender: the plates of its section, its length and how many are made.
 * Stiffener and bearing counts are per girder; the caller takes them from the layout
 * (see `tenderGirder`, which counts them as the check library lays them out).
 */
export interface TenderGirder {
  mark: string;
  /** girders of this mark, - */
  quantity: number;
  /** girder length (flange and web plate length), mm */
  length: number;
  /** public section JSON, dimensions mm */
  section: SectionJson;
  /** intermediate stiffener positions per girder; each position has `section.stiffeners.sides` flats, - */
  stiffenerPositions: number;
  /** single bearing-stiffener flats per girder (a double-sided pair counts 2), - */
  bearingFlats: number;
  /** bearing flat size, mm; default `section.bearing`, else the check library's default size */
  bearing?: { width: number; thickness: number };
  /** load-bearing stiffener pairs per girder (section.loadStiffeners, double-sided), - */
  loadPairs?: number;
  /** stiffener pairs at lateral restraints per girder (section.restraintStiffeners, double-sided), - */
  restraintPairs?: number;
}

export type PlatePart = 'web' | 'top flange' | 'bottom flange' | 'flange' | 'stiffener' | 'bearing stiffener';

/** One line of the plate list a fabricator orders from. */
export interface PlateLine {
  /** 'plate' for web and flange plates, 'flat' for stiffener flat bars */
  kind: 'plate' | 'flat';
  grade: GradeName;
  /** mm */
  thickness: number;
  /** plate width or flat-bar width, mm */
  width: number;
  /** mm */
  length: number;
  /** pieces over the whole schedule, - */
  count: number;
  /** kg of one piece */
  unitMass: number;
  /** kg of all pieces */
  mass: number;
  /** marks that use this piece, in input order */
  marks: string[];
  /** what the pieces are used for */
  parts: PlatePart[];
}

export interface MarkTonnage {
  mark: string;
  quantity: number;
  /** mm */
  length: number;
  /** kg of one girder, by part and in total */
  perGirder: { web: number; topFlange: number; bottomFlange: number; stiffeners: number; bearing: number; total: number };
  /** kg/m of one girder */
  perMetre: number;
  /** quantity × perGirder.total, kg */
  total: number;
  /** quantity × cost of one girder; null when a rate is missing or none were given */
  cost: number | null;
}

export interface Tonnage {
  /** Σ over marks, kg */
  total: number;
  /** Σ quantity, - */
  girders: number;
  byGrade: { grade: GradeName; mass: number; cost: number | null }[];
  byThickness: { thickness: number; kind: 'plate' | 'flat'; mass: number }[];
  byMark: MarkTonnage[];
  plates: PlateLine[];
  /** Σ mass × rate of its grade; null when no rates were given or one is missing */
  cost: number | null;
  /** grades that carry mass but have no rate (empty when no rates were given) */
  missingRates: GradeName[];
}

/** Material rates: cost per kg of each grade (any currency; the unit is the caller's). */
export type Rates = Partial<Record<GradeName, number>>;

/** Mass of a rectangular plate piece t × b × L (mm), kg. Density 7850 kg/m³ (EN 1991-1-1 Table A.4 gives 77.0–78.5 kN/m³ for steel). */
export function pieceMass(t: number, b: number, L: number): number {
  return t * b * L * STEEL_KG_PER_MM3;
}

interface Grades {
  web: GradeName;
  flanges: GradeName;
  stiffeners: GradeName;
}

function gradesOf(s: SectionJson): Grades {
  const g = s.grade ?? 'S355';
  if (typeof g === 'string') return { web: g as GradeName, flanges: g as GradeName, stiffeners: g as GradeName };
  return { web: g.web as GradeName, flanges: g.flanges as GradeName, stiffeners: (g.stiffeners ?? g.web) as GradeName };
}

function positive(v: number, field: string, hint: string, integer = false): void {
  if (!Number.isFinite(v) || v < 0 || (integer && !Number.isInteger(v))) {
    throw new DomainError('BAD_TENDER_INPUT', `${field} must be a ${integer ? 'whole number' : 'number'} ≥ 0, got ${v}`, hint, field, { value: v });
  }
}

function bearingOf(g: TenderGirder): { width: number; thickness: number } {
  if (g.bearing) return g.bearing;
  if (g.section.bearing) return { width: g.section.bearing.width, thickness: g.section.bearing.thickness };
  const s = toSection(g.section);
  const b = resolveBearing(s, material(s, { fySource: 'product' }).fyStiff);
  return { width: b.bs, thickness: b.ts };
}

/**
 * A tender girder with its stiffener and bearing counts laid out as the check library lays
 * them out for `girderMass` (EN 1993-1-5 panels between supports; bearing stiffeners
 * double-sided at every support, two pairs at a rigid end post).
 * @param supports support positions, mm (first = 0, last = girder length)
 */
export function tenderGirder(mark: string, quantity: number, section: SectionJson, supports: readonly number[]): TenderGirder {
  if (supports.length < 2) throw new DomainError('BAD_TENDER_INPUT', 'a girder needs at least two supports', 'give the support positions in mm', 'supports');
  const L = supports[supports.length - 1]! - supports[0]!;
  let positions = 0;
  const a = section.stiffeners?.spacing ?? null;
  // load-bearing pairs at the section's positions (published sections give them), as girderMass counts them
  const loadXs = section.loadStiffeners ? loadStiffenerPositions(supports, section.loadStiffeners.at ?? []) : [];
  if (a !== null && a > 0) {
    // the same rule as the check library's panelsOf: stiffeners at s0 + k·a short of the next support by more than 1 mm
    // (and none within 1 mm of a load-bearing pair)
    if (loadXs.length > 0) positions = panelsOf(supports, a, loadXs).stiffenerXs.length;
    else
      for (let i = 0; i + 1 < supports.length; i++) {
        const s0 = supports[i]!;
        const s1 = supports[i + 1]!;
        for (let k = 1; s0 + k * a < s1 - 1; k++) positions++;
      }
  }
  const pairs = bearingPairCount(section.endPost ?? 'rigid', supports.length, section.bearing?.pairs ?? 1);
  const restraintPairs = section.restraintStiffeners ? restraintStiffenerPositions(supports, section.restraintStiffeners.at ?? []).length : 0;
  return { mark, quantity, length: L, section, stiffenerPositions: positions, bearingFlats: 2 * pairs, loadPairs: loadXs.length, restraintPairs };
}

interface Piece {
  kind: 'plate' | 'flat';
  grade: GradeName;
  t: number;
  b: number;
  L: number;
  n: number;
  part: PlatePart;
}

function piecesOf(g: TenderGirder): { pieces: Piece[]; perGirder: MarkTonnage['perGirder'] } {
  const s = g.section;
  const gr = gradesOf(s);
  const hw = s.web.depth;
  const st = s.stiffeners;
  const sides = st ? st.sides : 0;
  const bearing = g.bearingFlats > 0 ? bearingOf(g) : { width: 0, thickness: 0 };
  const pieces: Piece[] = [
    { kind: 'plate', grade: gr.web, t: s.web.thickness, b: hw, L: g.length, n: 1, part: 'web' },
    { kind: 'plate', grade: gr.flanges, t: s.topFlange.thickness, b: s.topFlange.width, L: g.length, n: 1, part: 'top flange' },
    { kind: 'plate', grade: gr.flanges, t: s.bottomFlange.thickness, b: s.bottomFlange.width, L: g.length, n: 1, part: 'bottom flange' },
  ];
  if (st && g.stiffenerPositions > 0) pieces.push({ kind: 'flat', grade: gr.stiffeners, t: st.thickness, b: st.width, L: hw, n: g.stiffenerPositions * sides, part: 'stiffener' });
  const ls = s.loadStiffeners;
  if (ls && (g.loadPairs ?? 0) > 0) pieces.push({ kind: 'flat', grade: gr.stiffeners, t: ls.thickness, b: ls.width, L: hw, n: 2 * g.loadPairs!, part: 'stiffener' });
  const rs = s.restraintStiffeners;
  if (rs && (g.restraintPairs ?? 0) > 0) pieces.push({ kind: 'flat', grade: gr.stiffeners, t: rs.thickness, b: rs.width, L: hw, n: 2 * g.restraintPairs!, part: 'stiffener' });
  if (g.bearingFlats > 0) pieces.push({ kind: 'flat', grade: gr.stiffeners, t: bearing.thickness, b: bearing.width, L: hw, n: g.bearingFlats, part: 'bearing stiffener' });
  const m = (p: Piece | undefined) => (p ? p.n * pieceMass(p.t, p.b, p.L) : 0);
  const perGirder = {
    web: m(pieces[0]),
    topFlange: m(pieces[1]),
    bottomFlange: m(pieces[2]),
    // intermediate, load-bearing and restraint flats (girderMass's `stiffeners`)
    stiffeners: pieces.filter((p) => p.part === 'stiffener').reduce((sum, p) => sum + m(p), 0),
    bearing: m(pieces.find((p) => p.part === 'bearing stiffener')),
    total: 0,
  };
  perGirder.total = perGirder.web + perGirder.topFlange + perGirder.bottomFlange + perGirder.stiffeners + perGirder.bearing;
  return { pieces, perGirder };
}

function validate(g: TenderGirder, i: number): void {
  const f = (k: string) => `girders[${i}].${k}`;
  if (typeof g.mark !== 'string' || g.mark === '') throw new DomainError('BAD_TENDER_INPUT', `${f('mark')} is empty`, 'give every girder a mark', f('mark'));
  positive(g.quantity, f('quantity'), 'the number of girders of the mark', true);
  positive(g.length, f('length'), 'the girder length in mm');
  if (g.length === 0) throw new DomainError('BAD_TENDER_INPUT', `${f('length')} must be positive`, 'the girder length in mm', f('length'));
  positive(g.stiffenerPositions, f('stiffenerPositions'), 'stiffener positions per girder', true);
  positive(g.bearingFlats, f('bearingFlats'), 'single bearing flats per girder', true);
}

/**
 * Tonnage of a schedule: mass by grade, by plate thickness and by mark (quantity included),
 * the plate list, and cost when rates per kg per grade are given. Mass from the plates at
 * 7850 kg/m³; welds, snipes and cutting allowances are ignored (common practice, no source:
 * the estimator adds them as a percentage). Stiffener and bearing flats are listed at the full
 * web depth hw.
 */
export function tonnage(girders: readonly TenderGirder[], rates?: Rates): Tonnage {
  const lines = new Map<string, PlateLine>();
  const byGrade = new Map<GradeName, number>();
  const byThickness = new Map<string, { thickness: number; kind: 'plate' | 'flat'; mass: number }>();
  const byMark: MarkTonnage[] = [];
  const seen = new Set<string>();
  girders.forEach((g, i) => {
    validate(g, i);
    if (seen.has(g.mark)) throw new DomainError('BAD_TENDER_INPUT', `mark "${g.mark}" appears twice`, 'give each mark once with its quantity', `girders[${i}].mark`);
    seen.add(g.mark);
    const { pieces, perGirder } = piecesOf(g);
    let costOne: number | null = rates ? 0 : null;
    for (const p of pieces) {
      const unit = pieceMass(p.t, p.b, p.L);
      const count = p.n * g.quantity;
      const mass = unit * count;
      // flanges of the same plate are one line: the fabricator orders plates, not parts
      const key = `${p.kind}|${p.grade}|${p.t}|${p.b}|${p.L}`;
      const line = lines.get(key);
      const part: PlatePart = p.part === 'top flange' || p.part === 'bottom flange' ? 'flange' : p.part;
      if (line) {
        line.count += count;
        line.mass += mass;
        if (!line.marks.includes(g.mark)) line.marks.push(g.mark);
        if (!line.parts.includes(part)) line.parts.push(part);
      } else {
        lines.set(key, { kind: p.kind, grade: p.grade, thickness: p.t, width: p.b, length: p.L, count, unitMass: unit, mass, marks: [g.mark], parts: [part] });
      }
      byGrade.set(p.grade, (byGrade.get(p.grade) ?? 0) + mass);
      const tk = `${p.kind}|${p.t}`;
      const th = byThickness.get(tk) ?? { thickness: p.t, kind: p.kind, mass: 0 };
      th.mass += mass;
      byThickness.set(tk, th);
      if (costOne !== null) {
        const r = rates![p.grade];
        costOne = r === undefined ? null : costOne + r * unit * p.n;
      }
    }
    byMark.push({
      mark: g.mark,
      quantity: g.quantity,
      length: g.length,
      perGirder,
      perMetre: perGirder.total / (g.length / 1000),
      total: perGirder.total * g.quantity,
      cost: costOne === null ? null : costOne * g.quantity,
    });
  });
  const grades = [...byGrade.entries()].map(([grade, mass]) => {
    const r = rates?.[grade];
    return { grade, mass, cost: r === undefined ? null : r * mass };
  });
  grades.sort((a, b) => a.grade.localeCompare(b.grade));
  const missingRates = rates ? grades.filter((g) => g.cost === null).map((g) => g.grade) : [];
  const plates = [...lines.values()].sort(
    (a, b) => (a.kind === b.kind ? 0 : a.kind === 'plate' ? -1 : 1) || a.grade.localeCompare(b.grade) || a.thickness - b.thickness || b.width - a.width || b.length - a.length,
  );
  return {
    total: byMark.reduce((s, m) => s + m.total, 0),
    girders: byMark.reduce((s, m) => s + m.quantity, 0),
    byGrade: grades,
    byThickness: [...byThickness.values()].sort((a, b) => (a.kind === b.kind ? a.thickness - b.thickness : a.kind === 'plate' ? -1 : 1)),
    byMark,
    plates,
    cost: rates && missingRates.length === 0 ? grades.reduce((s, g) => s + g.cost!, 0) : null,
    missingRates,
  };
}
