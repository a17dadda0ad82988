/**
 * docs/clauses.md from the check registry: every clause a check names → the file and function that
 * compute it, and the unit of every value each check reports as published.
 * `pnpm docs:clauses` writes it; test/docs/clauses.test.ts fails when the committed file differs.
 */
import { writeFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { CHECKS, type CheckSpec } from '@platesmith/checks';
import { VALUE_UNITS } from '@platesmith/schema';

export const CLAUSES_PATH = fileURLToPath(new URL('../../docs/clauses.md', import.meta.url));

const INPUTS: Record<string, string> = {
  web: 'web plate',
  flanges: 'flange plates',
  panels: 'stiffener positions, end post',
  flats: 'stiffener flats',
  bearing: 'bearing stiffeners',
  loads: 'design effects',
};

export function renderClauses(): string {
  const specs: readonly CheckSpec[] = CHECKS;
  const rows: { clause: string; id: string; file: string; fn: string }[] = [];
  for (const c of specs) {
    for (const clause of [c.clause, ...(c.alsoClauses ?? [])]) rows.push({ clause, id: c.id, file: c.file, fn: c.fn });
    for (const b of c.beneath ?? []) rows.push({ clause: b.clause, id: c.id, file: b.file ?? c.file, fn: b.fn });
  }
  rows.sort((p, q) => p.clause.localeCompare(q.clause, 'en', { numeric: true }) || p.id.localeCompare(q.id));
  const out: string[] = [
    '<!-- Generated from the check registry (packages/checks/src/registry.ts) by `pnpm docs:clauses`; do not edit. -->',
    '',
    '# Clauses and where they are computed',
    '',
    'Every clause a check result names, and the clause-level functions beneath each check: the check',
    'it belongs to and the function that computes it (under `packages/checks/src/`). Results are a',
    "design aid to the Eurocodes' recommended values; they must be checked by a competent engineer",
    'against the governing code and national annex.',
    '',
    '| clause | check | file | function |',
    '|---|---|---|---|',
    ...rows.map((r) => `| ${r.clause} | \`${r.id}\` | [${r.file}](../packages/checks/src/${r.file}) | \`${r.fn}\` |`),
    '',
    '## The checks in report order',
    '',
    'What each check reads (a check that does not read an input gives the same result whatever it is;',
    'the search relies on it) and the unit of every value it reports, as published.',
    '',
  ];
  for (const c of specs) {
    const units = VALUE_UNITS[c.id as keyof typeof VALUE_UNITS];
    const values = Object.keys(c.values).map((k) => `\`${k}\` ${units[k] ?? 'text'}`);
    out.push(`### \`${c.id}\` — ${[c.clause, ...(c.alsoClauses ?? [])].join(' / ')}`, '');
    out.push(`- reads: ${c.reads.map((r) => INPUTS[r]).join(', ')}`);
    out.push(`- values: ${values.join(', ')}`, '');
  }
  return out.join('\n');
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  writeFileSync(CLAUSES_PATH, renderClauses());
  process.stdout.write(`wrote ${CLAUSES_PATH.slice(process.cwd().length + 1)}\n`);
}
