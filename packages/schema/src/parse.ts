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
  return {
    ok: false,
    issues: r.error.issues.map((i) => ({
      path: pathString(i.path),
      pointer: pointer(i.path),
      message: i.message,
      code: i.code,
      kind: VALUE_CODES.has(i.code) ? 'value' : 'shape',
    })),
  };
}

export function formatIssues(issues: readonly FieldIssue[]): string {
  return issues.map((i) => `${i.path || '(input)'}: ${i.message}`).join('\n');
}
