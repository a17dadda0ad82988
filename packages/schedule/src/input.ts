import { parseWith, type FieldIssue } from '@platesmith/schema';
import { ScheduleJson } from './schema.js';
import { parseScheduleCsv, type CsvIssue } from './tender/csv.js';

/** One problem of a schedule file, located as the file's format locates it. */
export interface ScheduleInputIssue {
  /** CSV: 1-based row (header = row 1); JSON: the line of a syntax error; absent otherwise */
  row?: number;
  /** CSV: the column name; null for a whole-row problem */
  column?: string | null;
  /** JSON: the field path, e.g. "girders[2].quantity" */
  path?: string;
  /** JSON pointer of the field (RFC 6901), e.g. "#/girders/2/quantity" */
  pointer?: string;
  /** 'shape': the file is not a schedule (wrong type, unknown column); 'value': a value is not meaningful */
  kind: 'shape' | 'value';
  /** the full message, naming the row and column or the field */
  message: string;
}

export type ScheduleParsed = { ok: true; value: ScheduleJson } | { ok: false; issues: ScheduleInputIssue[] };

const fromField = (i: FieldIssue): ScheduleInputIssue => ({ path: i.path, pointer: i.pointer, kind: i.kind, message: `${i.path || '(schedule)'}: ${i.message}` });

function fromCsv(i: CsvIssue): ScheduleInputIssue {
  const shape = i.row === 0 || i.row === 1 || /unknown column|more cells than|header/.test(i.message);
  return { row: i.row, column: i.column, kind: shape ? 'shape' : 'value', message: i.message };
}

/** Line and column of a JSON.parse error position (Node's message carries "position N"). */
function jsonWhere(text: string, message: string): { row?: number; message: string } {
  const pos = /position (\d+)/.exec(message);
  if (!pos) return { message };
  const before = text.slice(0, Number(pos[1]));
  const line = before.split('\n').length;
  const col = before.length - before.lastIndexOf('\n');
  return { row: line, message: `line ${line}, column ${col}: ${message}` };
}

/** A schedule object (already parsed JSON, or a CSV schedule) validated as ScheduleJson. */
export function parseSchedule(value: unknown): ScheduleParsed {
  const p = parseWith(ScheduleJson, value);
  return p.ok ? { ok: true, value: p.value } : { ok: false, issues: p.issues.map(fromField) };
}

/**
 * A schedule file's text: JSON (`{ defaults, girders: [...] }`) or CSV (one row per mark, see
 * tender/CSV.md; `extra` gives the fields a CSV cannot carry: defaults, baseline, tender, name).
 * Never throws for bad text: every problem is an issue naming its row and column (CSV), its
 * line (malformed JSON) or its field path (JSON).
 */
export function parseScheduleText(text: string, format: 'json' | 'csv', extra: Record<string, unknown> = {}): ScheduleParsed {
  if (format === 'csv') {
    const defaults = (extra['defaults'] as Record<string, unknown> | undefined) ?? {};
    const c = parseScheduleCsv(text, defaults);
    if (!c.ok) return { ok: false, issues: c.issues.map(fromCsv) };
    return parseSchedule({ ...extra, defaults: c.value.defaults, girders: c.value.girders });
  }
  let value: unknown;
  try {
    value = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  } catch (e) {
    const w = jsonWhere(text, (e as Error).message);
    return { ok: false, issues: [{ ...(w.row !== undefined ? { row: w.row } : {}), kind: 'shape', message: `not valid JSON: ${w.message}` }] };
  }
  if (typeof value === 'object' && value !== null && !Array.isArray(value)) value = { ...extra, ...(value as Record<string, unknown>) };
  return parseSchedule(value);
}
