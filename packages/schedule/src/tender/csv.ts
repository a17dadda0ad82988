import { parse } from 'csv-parse/sync';
import { GRADES } from '@platesmith/catalogue';
import { SectionJson } from '@platesmith/schema';

/** One bad cell (or row, or the file), located as a spreadsheet shows it: the header is row 1. */
export interface CsvIssue {
  /** 1-based row; the header is row 1; 0 when the file as a whole is unreadable */
  row: number;
  /** column name as in the header, null for a whole-row or whole-file problem */
  column: string | null;
  /** full message, e.g. "row 4, column q_udl: 'abc' is not a number" */
  message: string;
}

/** A characteristic action as the schedule's problem fields take it (kN/m, kN, mm). */
export interface CsvAction {
  kind: 'permanent' | 'variable';
  load: 'udl' | 'point';
  /** kN/m for udl, kN for point */
  value: number;
  /** mm from the left end, point loads */
  at?: number;
  category?: string;
  name?: string;
}

export interface CsvGirder {
  mark: string;
  quantity: number;
  /** mm */
  spans?: number[];
  actions?: CsvAction[];
  combination?: '6.10' | '6.10ab';
  options?: { restraint?: 'continuous' | { spacing: number }; factors?: 'buildings' | 'bridges' };
  space?: { grade?: string | string[]; maxDepth?: number; minDepth?: number };
  adopted?: SectionJson;
  note?: string;
}

export interface CsvSchedule {
  defaults: Record<string, unknown>;
  girders: CsvGirder[];
}

export type CsvParsed = { ok: true; value: CsvSchedule } | { ok: false; issues: CsvIssue[] };

/** The most columns a header may have: about four times the known ones (a wider one is not a schedule). */
export const CSV_MAX_COLUMNS = 100;

/** The columns, in a documented order (see CSV.md beside this file). */
export const CSV_COLUMNS = [
  'mark',
  'quantity',
  'spans',
  'g_udl',
  'q_udl',
  'q_category',
  'g_point',
  'q_point',
  'combination',
  'restraint',
  'factors',
  'grade',
  'max_depth',
  'min_depth',
  'adopted_hw',
  'adopted_tw',
  'adopted_bf',
  'adopted_tf',
  'adopted_bf_bot',
  'adopted_tf_bot',
  'adopted_a',
  'adopted_bs',
  'adopted_ts',
  'adopted_sides',
  'adopted_end_post',
  'adopted_grade',
  'note',
] as const;
type Column = (typeof CSV_COLUMNS)[number];

const CATEGORIES = ['A', 'B', 'C', 'D', 'E', 'F', 'G', 'H', 'snow', 'snow-high-altitude', 'wind', 'temperature'];
const ADOPTED_FIELDS: Partial<Record<string, Column>> = {
  'web.depth': 'adopted_hw',
  'web.thickness': 'adopted_tw',
  'topFlange.width': 'adopted_bf',
  'topFlange.thickness': 'adopted_tf',
  'bottomFlange.width': 'adopted_bf_bot',
  'bottomFlange.thickness': 'adopted_tf_bot',
  'stiffeners.spacing': 'adopted_a',
  'stiffeners.width': 'adopted_bs',
  'stiffeners.thickness': 'adopted_ts',
  'stiffeners.sides': 'adopted_sides',
  endPost: 'adopted_end_post',
  grade: 'adopted_grade',
};

class Row {
  constructor(
    readonly row: number,
    private readonly cells: Partial<Record<Column, string>>,
    readonly issues: CsvIssue[],
  ) {}

  fail(column: Column | null, what: string): undefined {
    this.issues.push({ row: this.row, column, message: `row ${this.row}${column ? `, column ${column}` : ''}: ${what}` });
    return undefined;
  }

  text(c: Column): string | undefined {
    const v = this.cells[c];
    return v === undefined || v === '' ? undefined : v;
  }

  /** a finite number; `min` exclusive unless `orZero` */
  num(c: Column, opts: { positive?: boolean; integer?: boolean; mm?: boolean } = {}): number | undefined {
    const s = this.text(c);
    if (s === undefined) return undefined;
    return this.numberIn(c, s, opts);
  }

  numberIn(c: Column, s: string, opts: { positive?: boolean; integer?: boolean; mm?: boolean; what?: string } = {}): number | undefined {
    const t = s.trim();
    const v = t === '' ? NaN : Number(t);
    const what = opts.what ? `${opts.what} ` : '';
    if (!Number.isFinite(v)) return this.fail(c, `${what}'${s}' is not a number`);
    if (opts.integer && !Number.isInteger(v)) return this.fail(c, `${what}'${s}' is not a whole number`);
    if (opts.positive && v <= 0) return this.fail(c, `${what}'${s}' must be positive`);
    if (opts.mm && v > 0 && v < 100) return this.fail(c, `${what}'${s}' mm is implausibly small; lengths are in mm (24000 for 24 m)`);
    return v;
  }

  list(c: Column): string[] | undefined {
    const s = this.text(c);
    if (s === undefined) return undefined;
    return s.split(';').map((p) => p.trim());
  }

  oneOf<T extends string>(c: Column, allowed: readonly T[]): T | undefined {
    const s = this.text(c);
    if (s === undefined) return undefined;
    const hit = allowed.find((a) => a.toLowerCase() === s.toLowerCase());
    if (hit === undefined) return this.fail(c, `'${s}' is not one of ${allowed.join(', ')}`);
    return hit;
  }
}

function points(r: Row, c: Column, kind: 'permanent' | 'variable', category: string | undefined, length: number | undefined): CsvAction[] {
  const parts = r.list(c);
  if (!parts) return [];
  const out: CsvAction[] = [];
  parts.forEach((p, k) => {
    const m = /^([^@]+)@([^@]+)$/.exec(p);
    if (!m) {
      r.fail(c, `'${p}' is not a point load "P@x" (kN@mm), e.g. "50@6000;50@12000"`);
      return;
    }
    const P = r.numberIn(c, m[1]!, { what: `load ${k + 1}: P =` });
    const x = r.numberIn(c, m[2]!, { what: `load ${k + 1}: x =` });
    if (P === undefined || x === undefined) return;
    if (x < 0 || (length !== undefined && x > length)) {
      r.fail(c, `load ${k + 1}: x = ${x} mm is outside the girder (0 to ${length ?? '?'} mm)`);
      return;
    }
    const a: CsvAction = { kind, load: 'point', value: P, at: x, name: `${c} ${k + 1}` };
    if (category) a.category = category;
    out.push(a);
  });
  return out;
}

function adoptedOf(r: Row): SectionJson | undefined {
  const cols = CSV_COLUMNS.filter((c) => c.startsWith('adopted_'));
  if (cols.every((c) => r.text(c) === undefined)) return undefined;
  const before = r.issues.length;
  const hw = r.num('adopted_hw');
  const tw = r.num('adopted_tw');
  const bf = r.num('adopted_bf');
  const tf = r.num('adopted_tf');
  const bfb = r.num('adopted_bf_bot');
  const tfb = r.num('adopted_tf_bot');
  const a = r.num('adopted_a');
  const bs = r.num('adopted_bs');
  const ts = r.num('adopted_ts');
  const sides = r.num('adopted_sides', { integer: true });
  const endPost = r.oneOf('adopted_end_post', ['rigid', 'non-rigid'] as const);
  const grade = r.oneOf('adopted_grade', GRADES as unknown as readonly string[]);
  for (const [c, v] of [['adopted_hw', hw], ['adopted_tw', tw], ['adopted_bf', bf], ['adopted_tf', tf]] as const) {
    if (v === undefined && r.text(c) === undefined) r.fail(c, 'is empty; an adopted section needs adopted_hw, adopted_tw, adopted_bf and adopted_tf');
  }
  const stiff = [a, bs, ts];
  if (stiff.some((v) => v !== undefined) && stiff.some((v) => v === undefined)) {
    const missing = (['adopted_a', 'adopted_bs', 'adopted_ts'] as const).filter((c) => r.text(c) === undefined);
    for (const c of missing) r.fail(c, 'is empty; stiffeners need adopted_a, adopted_bs and adopted_ts (leave all three empty for none)');
  }
  if (r.issues.length > before) return undefined;
  const raw = {
    web: { depth: hw, thickness: tw },
    topFlange: { width: bf, thickness: tf },
    bottomFlange: { width: bfb ?? bf, thickness: tfb ?? tf },
    stiffeners: a !== undefined ? { spacing: a, width: bs, thickness: ts, ...(sides !== undefined ? { sides } : {}) } : null,
    ...(endPost ? { endPost } : {}),
    ...(grade ? { grade } : {}),
  };
  const p = SectionJson.safeParse(raw);
  if (p.success) return p.data;
  for (const i of p.error.issues) {
    const key = i.path.join('.');
    const col = ADOPTED_FIELDS[key] ?? null;
    r.fail(col, i.message);
  }
  return undefined;
}

function girderOf(r: Row, seen: Map<string, number>): CsvGirder | undefined {
  const before = r.issues.length;
  const mark = r.text('mark');
  if (mark === undefined) r.fail('mark', 'is empty; every row needs a mark');
  else if (mark.length > 40) r.fail('mark', `'${mark}' is longer than 40 characters`);
  else if (seen.has(mark)) r.fail('mark', `'${mark}' repeats row ${seen.get(mark)}`);
  else seen.set(mark, r.row);
  let quantity = r.num('quantity', { integer: true, positive: true });
  if (quantity === undefined && r.text('quantity') === undefined) {
    r.fail('quantity', 'is empty; give the number of girders of the mark');
  }
  let spans: number[] | undefined;
  const sp = r.list('spans');
  if (sp) {
    const vs = sp.map((s, k) => r.numberIn('spans', s, { positive: true, mm: true, what: sp.length > 1 ? `span ${k + 1}:` : '' }));
    if (vs.every((v) => v !== undefined)) spans = vs as number[];
  }
  const L = spans?.reduce((s, v) => s + v, 0);
  const category = r.oneOf('q_category', CATEGORIES);
  const actions: CsvAction[] = [];
  const g = r.num('g_udl');
  if (g !== undefined) actions.push({ kind: 'permanent', load: 'udl', value: g, name: 'g_udl' });
  const q = r.num('q_udl');
  if (q !== undefined) actions.push({ kind: 'variable', load: 'udl', value: q, name: 'q_udl', ...(category ? { category } : {}) });
  actions.push(...points(r, 'g_point', 'permanent', undefined, L));
  actions.push(...points(r, 'q_point', 'variable', category, L));
  const combination = r.oneOf('combination', ['6.10', '6.10ab'] as const);
  const options: NonNullable<CsvGirder['options']> = {};
  const rs = r.text('restraint');
  if (rs !== undefined) {
    if (rs.toLowerCase() === 'continuous') options.restraint = 'continuous';
    else {
      const v = r.numberIn('restraint', rs, { positive: true, mm: true });
      if (v !== undefined) options.restraint = { spacing: v };
      else r.issues[r.issues.length - 1]!.message += ' (a restraint spacing in mm, or "continuous")';
    }
  }
  const factors = r.oneOf('factors', ['buildings', 'bridges'] as const);
  if (factors) options.factors = factors;
  const space: NonNullable<CsvGirder['space']> = {};
  const grades = r.list('grade');
  if (grades) {
    const ok = grades.map((s) => {
      const hit = (GRADES as readonly string[]).find((G) => G.toLowerCase() === s.toLowerCase());
      if (!hit) r.fail('grade', `'${s}' is not one of ${GRADES.join(', ')}`);
      return hit;
    });
    if (ok.every((v) => v !== undefined)) space.grade = ok.length === 1 ? ok[0]! : (ok as string[]);
  }
  const maxDepth = r.num('max_depth', { positive: true, mm: true });
  if (maxDepth !== undefined) space.maxDepth = maxDepth;
  const minDepth = r.num('min_depth', { positive: true, mm: true });
  if (minDepth !== undefined) space.minDepth = minDepth;
  if (maxDepth !== undefined && minDepth !== undefined && minDepth > maxDepth) r.fail('min_depth', `${minDepth} mm is more than max_depth ${maxDepth} mm`);
  const adopted = adoptedOf(r);
  const note = r.text('note');
  if (r.issues.length > before) return undefined;
  quantity = quantity!;
  const out: CsvGirder = { mark: mark!, quantity };
  if (spans) out.spans = spans;
  if (actions.length > 0) out.actions = actions;
  if (combination) out.combination = combination;
  if (Object.keys(options).length > 0) out.options = options;
  if (Object.keys(space).length > 0) out.space = space;
  if (adopted) out.adopted = adopted;
  if (note) out.note = note;
  return out;
}

/**
 * A girder schedule from CSV (one row per mark; columns in CSV.md), parsed with csv-parse 7
 * (UTF-8 BOM, CRLF, quoted cells). Every bad cell is reported with its row and column; the
 * parser never throws for bad text. `defaults` is passed through (e.g. from a side file).
 */
export function parseScheduleCsv(text: string | Uint8Array, defaults: Record<string, unknown> = {}): CsvParsed {
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(typeof text === 'string' ? text : Buffer.from(text), {
      bom: true,
      trim: true,
      skip_empty_lines: true,
      relax_column_count: true,
      info: true,
    }) as unknown as { record: string[]; info: { lines: number } }[];
  } catch (e) {
    const err = e as { lines?: number; message?: string };
    const row = typeof err.lines === 'number' ? err.lines : 0;
    return { ok: false, issues: [{ row, column: null, message: `${row ? `row ${row}: ` : ''}not readable as CSV (${err.message ?? String(e)})` }] };
  }
  const startRow = (x: { record: string[]; info: { lines: number } }) => x.info.lines - x.record.reduce((n, c) => n + (c.match(/\n/g)?.length ?? 0), 0);
  const issues: CsvIssue[] = [];
  const head = records[0];
  if (!head) return { ok: false, issues: [{ row: 0, column: null, message: 'the file has no header row' }] };
  const hr = startRow(head);
  // a header far wider than the known columns is refused whole, before any per-column work or issue (issue 16)
  if (head.record.length > CSV_MAX_COLUMNS) {
    return { ok: false, issues: [{ row: hr, column: null, message: `row ${hr}: the header has ${head.record.length} columns, over the limit of ${CSV_MAX_COLUMNS} (known: ${CSV_COLUMNS.join(', ')})` }] };
  }
  const header = head.record.map((h) => h.trim().toLowerCase());
  const known = new Set<string>(CSV_COLUMNS);
  const seenColumns = new Set<string>();
  header.forEach((h, k) => {
    if (h === '') issues.push({ row: hr, column: null, message: `row ${hr}: header cell ${k + 1} is empty` });
    else if (!known.has(h)) issues.push({ row: hr, column: h, message: `row ${hr}, column ${h}: unknown column (known: ${CSV_COLUMNS.join(', ')})` });
    else if (seenColumns.has(h)) issues.push({ row: hr, column: h, message: `row ${hr}, column ${h}: column appears twice` });
    seenColumns.add(h);
  });
  for (const c of ['mark', 'quantity'] as const) {
    if (!header.includes(c)) issues.push({ row: hr, column: c, message: `row ${hr}: the header has no ${c} column` });
  }
  if (issues.length > 0) return { ok: false, issues };
  if (records.length === 1) return { ok: false, issues: [{ row: hr, column: null, message: `row ${hr}: the file has a header but no girder rows` }] };
  const girders: CsvGirder[] = [];
  const seen = new Map<string, number>();
  for (const rec of records.slice(1)) {
    const row = startRow(rec);
    if (rec.record.length > header.length && rec.record.slice(header.length).some((c) => c !== '')) {
      issues.push({ row, column: null, message: `row ${row}: ${rec.record.length} cells for ${header.length} columns` });
      continue;
    }
    const cells: Partial<Record<Column, string>> = {};
    header.forEach((h, k) => (cells[h as Column] = rec.record[k] ?? ''));
    const g = girderOf(new Row(row, cells, issues), seen);
    if (g) girders.push(g);
  }
  if (issues.length > 0) return { ok: false, issues };
  return { ok: true, value: { defaults, girders } };
}
