import type { z } from 'zod';

export interface FieldIssue {
  /** JSON path in the trade's notation, e.g. "effects[2].x" ("" for the whole body) */
  path: string;
  /** JSON pointer, e.g. "#/effects/2/x" */
  pointer: string;
  message: string;
  code: string;
  /**
   * 'shape': the JSON is not of the schema's form (wrong type, unknown or missing field) → 400;
   * 'value': well-formed but meaningless (a refinement or range failed) → 422.
   */
  kind: 'shape' | 'value';
}

const VALUE_CODES = new Set(['custom', 'too_small', 'too_big', 'not_multiple_of']);

export type Parsed<T> = { ok: true; value: T } | { ok: false; issues: FieldIssue[] };

export function pathString(path: readonly PropertyKey[]): string {
  let out = '';
  for (const p of path) {
    if (typeof p === 'number') out += `[${p}]`;
    else out += out === '' ? String(p) : `.${String(p)}`;
  }
  return out;
}

function pointer(path: readonly PropertyKey[]): string {
  return '#' + path.map((p) => '/' + String(p).replace(/~/g, '~0').replace(/\//g, '~1')).join('');
}

/** Expected failures as data: every offending field with its JSON path and a message. */
export function parseWith<S extends z.ZodType>(schema: S, data: unknown): Parsed<z.output<S>> {
  const r = schema.safeParse(data);
  if (r.success) return { ok: true, value: r.data };
  const issues: FieldIssue[] = [];
  for (const i of r.error.issues) {
    // an unknown key is reported at its own path (zod reports it at the object's)
    if (i.code === 'unrecognized_keys') {
      for (const k of i.keys) {
        const path = [...i.path, k];
        issues.push({ path: pathString(path), pointer: pointer(path), message: `unknown field "${k}"`, code: i.code, kind: 'shape' });
      }
      continue;
    }
    issues.push({ path: pathString(i.path), pointer: pointer(i.path), message: i.message, code: i.code, kind: VALUE_CODES.has(i.code) ? 'value' : 'shape' });
  }
  return { ok: false, issues };
}

/** The most issues an answer lists (a body of 20 000 bad stations had 80 001): the count says how many there were. */
export const MAX_LISTED_ISSUES = 100;

export function formatIssues(issues: readonly FieldIssue[]): string {
  const shown = issues.slice(0, MAX_LISTED_ISSUES).map((i) => `${i.path || '(input)'}: ${i.message}`);
  if (issues.length > MAX_LISTED_ISSUES) shown.push(`… and ${issues.length - MAX_LISTED_ISSUES} more (${issues.length} in all)`);
  return shown.join('\n');
}
