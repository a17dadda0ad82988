import { CAUTION, SCOPE, type Assumption, type PublishedCheck, type PublishedVerdict } from '@platesmith/schema';
import { fmt, table, TABLE_WIDTH } from './table.js';

/** The values a reader wants first for each check (others stay in --json). */
const KEY_VALUES: Record<string, string[]> = {
  classification: ['sectionClass', 'flangeClass', 'webClass'],
  bending: ['McRd', 'sectionClass'],
  shear: ['VplRd'],
  'shear-buckling': ['lambdaW', 'chiW', 'VbRd'],
  'bending-shear': ['eta1', 'eta3'],
  'flange-induced-buckling': ['ratio', 'limit'],
  'patch-loading': ['FRd'],
  'patch-bending': [],
  'stiffener-stiffness': ['Ist', 'IstMin'],
  'stiffener-strength': ['NEd', 'NbRd'],
  'load-bearing-stiffener': ['part', 'F', 'NEd', 'NbRd', 'Lcr'],
  'restraint-stiffener': ['part', 'Fr', 'M', 'MRd'],
  'stiffener-torsion': ['ItOverIp', 'limit'],
  'end-post': ['Ast', 'AstMin'],
  'bearing-stiffener': ['R', 'NbRd'],
  'lateral-torsional-buckling': ['Mcr', 'chiLT', 'MbRd'],
  deflection: ['delta', 'limit'],
  'web-flange-weld': ['throat'],
};

function keyValues(c: PublishedCheck): string {
  if (!c.applies) return c.reason ?? '';
  return (KEY_VALUES[c.id] ?? [])
    .filter((k) => c.values[k] !== undefined)
    .map((k) => {
      const v = c.values[k]!;
      return `${k} ${typeof v === 'number' ? fmt(v, 4) : String(v)}`;
    })
    .join(', ');
}

/** The checks as a table: check, clause, utilisation, result, station; --wide adds the key values. */
export function renderChecks(v: PublishedVerdict, wide = false): string {
  const rows = v.checks.map((c) => [
    c.id,
    c.clause,
    c.applies ? (c.utilisation === null ? 'inf' : c.utilisation.toFixed(3)) : '-',
    c.applies ? (c.passes ? 'ok' : 'FAILS') : 'n/a',
    c.at === null ? '' : String(Math.round(c.at)),
    ...(wide ? [keyValues(c)] : []),
  ]);
  const g = v.governing;
  const head = ['check', 'clause', 'util.', 'result', 'at x (mm)', ...(wide ? ['key values (kN, kNm, mm)'] : [])];
  return [
    table(head, rows, ['l', 'l', 'r', 'l', 'r', 'l'], wide ? Infinity : TABLE_WIDTH),
    '',
    `${v.passes ? 'PASSES' : 'FAILS'} — governing: ${g.id} (${g.clause}), utilisation ${g.utilisation === null ? 'inf' : g.utilisation.toFixed(3)}${g.at === null ? '' : ` at x = ${Math.round(g.at)} mm`}`,
  ].join('\n');
}

/** The defaults the answer applied, one a line (empty when none). */
export function renderAssumptions(list: readonly Assumption[]): string {
  if (list.length === 0) return '';
  const v = (x: Assumption['value']) => (Array.isArray(x) ? x.join(', ') : String(x));
  // each line wrapped at the tables' width, continued under its text
  const wrap = (text: string): string => {
    const out: string[] = [];
    let line = '';
    for (const word of text.split(' ')) {
      if (line && line.length + 1 + word.length > TABLE_WIDTH) {
        out.push(line);
        line = `      ${word}`;
      } else line = line ? `${line} ${word}` : word;
    }
    out.push(line);
    return out.join('\n');
  };
  return `Assumed (not given in the input):\n${list.map((a) => wrap(`  ${a.field} = ${v(a.value)}: ${a.note}`)).join('\n')}\n\n`;
}

export function caution(): string {
  return `Caution: ${CAUTION}\n${SCOPE}`;
}
