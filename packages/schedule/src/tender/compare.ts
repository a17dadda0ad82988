import { DomainError } from '@platesmith/catalogue';
import type { PublishedSearch, PublishedVerdict } from '@platesmith/schema';

/**
 * What the nightly comparison keeps of one mark. `adoptedPasses` and `adoptedGoverning` are
 * absent when the mark has no adopted section; `lightestMass` (kg per girder) and
 * `lightestGoverning` are null when the search found no feasible section.
 */
export interface MarkRecord {
  mark: string;
  adoptedPasses?: boolean;
  /** id of the governing check of the adopted section */
  adoptedGoverning?: string;
  /** kg of one girder of the lightest feasible section */
  lightestMass: number | null;
  /** id of the governing check of the lightest section */
  lightestGoverning: string | null;
}

export type CompareStatus = 'pass' | 'regressed' | 'changed' | 'new' | 'removed';

export interface CompareResult {
  mark: string;
  status: CompareStatus;
  /** human-readable, in the order found; empty for 'pass' */
  reasons: string[];
  baseline: MarkRecord | null;
  current: MarkRecord | null;
}

export interface CompareOptions {
  /** relative change of the lightest mass that counts as a change, - (e.g. 0.01 for 1 %) */
  massTolerance: number;
}

/** The record of one mark from its published search and its adopted check (either may be null). */
export function markRecord(mark: string, search: Pick<PublishedSearch, 'lightest'> | null, adopted: Pick<PublishedVerdict, 'passes' | 'governing'> | null): MarkRecord {
  const r: MarkRecord = {
    mark,
    lightestMass: search?.lightest?.mass ?? null,
    lightestGoverning: search?.lightest?.governing.id ?? null,
  };
  if (adopted) {
    r.adoptedPasses = adopted.passes;
    r.adoptedGoverning = adopted.governing.id;
  }
  return r;
}

const kg = (v: number) => `${v.toFixed(1)} kg`;
const pct = (v: number) => `${(v * 100).toFixed(2)} %`;

function index(records: readonly MarkRecord[], which: string): Map<string, MarkRecord> {
  const m = new Map<string, MarkRecord>();
  records.forEach((r, i) => {
    if (m.has(r.mark)) throw new DomainError('DUPLICATE_MARK', `${which}[${i}]: mark "${r.mark}" appears twice`, 'each mark once per run', `${which}[${i}].mark`);
    m.set(r.mark, r);
  });
  return m;
}

/**
 * Compare a run against its baseline, mark by mark (baseline order, then new marks in current
 * order). regressed: the adopted section passed and now fails. changed: the governing check of
 * the adopted or the lightest section changed, the lightest mass moved by more than
 * `massTolerance` (relative to the baseline), or a feasible section appeared or vanished.
 */
export function compare(baseline: readonly MarkRecord[], current: readonly MarkRecord[], opts: CompareOptions): CompareResult[] {
  if (!(Number.isFinite(opts.massTolerance) && opts.massTolerance >= 0)) {
    throw new DomainError('BAD_TOLERANCE', `massTolerance must be a number ≥ 0, got ${opts.massTolerance}`, 'a relative tolerance, e.g. 0.01 for 1 %', 'massTolerance');
  }
  const b = index(baseline, 'baseline');
  const c = index(current, 'current');
  const out: CompareResult[] = [];
  for (const [mark, was] of b) {
    const now = c.get(mark);
    if (!now) {
      out.push({ mark, status: 'removed', reasons: ['mark is not in the current run'], baseline: was, current: null });
      continue;
    }
    const regressed: string[] = [];
    const changed: string[] = [];
    if (was.adoptedPasses === true && now.adoptedPasses === false) {
      regressed.push(`adopted section passed and now fails (governing: ${now.adoptedGoverning ?? 'unknown'})`);
    } else if (was.adoptedPasses !== now.adoptedPasses) {
      if (now.adoptedPasses === undefined) changed.push('adopted section no longer given');
      else if (was.adoptedPasses === undefined) changed.push(`adopted section now given (${now.adoptedPasses ? 'passes' : 'fails'})`);
      else changed.push('adopted section failed and now passes');
    }
    if (was.adoptedGoverning !== undefined && now.adoptedGoverning !== undefined && was.adoptedGoverning !== now.adoptedGoverning) {
      changed.push(`adopted governing check ${was.adoptedGoverning} → ${now.adoptedGoverning}`);
    }
    if (was.lightestMass !== null && now.lightestMass === null) changed.push('no feasible section any more');
    else if (was.lightestMass === null && now.lightestMass !== null) changed.push(`a feasible section now exists (${kg(now.lightestMass)})`);
    else if (was.lightestMass !== null && now.lightestMass !== null) {
      const rel = now.lightestMass / was.lightestMass - 1;
      if (Math.abs(rel) > opts.massTolerance) changed.push(`lightest mass ${kg(was.lightestMass)} → ${kg(now.lightestMass)} (${rel > 0 ? '+' : ''}${pct(rel)}, tolerance ${pct(opts.massTolerance)})`);
    }
    if (was.lightestGoverning !== null && now.lightestGoverning !== null && was.lightestGoverning !== now.lightestGoverning) {
      changed.push(`lightest governing check ${was.lightestGoverning} → ${now.lightestGoverning}`);
    }
    const status: CompareStatus = regressed.length > 0 ? 'regressed' : changed.length > 0 ? 'changed' : 'pass';
    out.push({ mark, status, reasons: [...regressed, ...changed], baseline: was, current: now });
  }
  for (const [mark, now] of c) {
    if (!b.has(mark)) out.push({ mark, status: 'new', reasons: ['mark is not in the baseline'], baseline: null, current: now });
  }
  return out;
}

/** XML 1.0 text: the five predefined entities escaped, characters XML 1.0 cannot carry dropped. */
export function xmlEscape(s: string): string {
  return s
    // eslint-disable-next-line no-control-regex
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, '')
    .replace(/[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/g, '')
    .replace(/&/g, '&amp;')
    .replace(/</g, '&lt;')
    .replace(/>/g, '&gt;')
    .replace(/"/g, '&quot;')
    .replace(/'/g, '&apos;');
}

/**
 * JUnit XML: one testsuite, one testcase per mark; a failure for 'regressed', a skipped
 * element for 'removed', reasons as system-out otherwise.
 */
export function toJUnit(results: readonly CompareResult[], suiteName = 'girder schedule regression'): string {
  const failures = results.filter((r) => r.status === 'regressed').length;
  const skipped = results.filter((r) => r.status === 'removed').length;
  const cases = results.map((r) => {
    const open = `    <testcase classname="${xmlEscape(suiteName)}" name="${xmlEscape(r.mark)}">`;
    const text = xmlEscape(r.reasons.join('\n'));
    let body = '';
    if (r.status === 'regressed') body = `\n      <failure message="${xmlEscape(r.reasons[0] ?? 'regressed')}" type="regressed">${text}</failure>`;
    else if (r.status === 'removed') body = `\n      <skipped message="${xmlEscape(r.reasons[0] ?? 'removed')}"/>`;
    if (r.status !== 'pass' && r.status !== 'removed') body += `\n      <system-out>${xmlEscape(`status: ${r.status}\n`)}${text}</system-out>`;
    return `${open}${body}${body ? '\n    ' : ''}</testcase>`;
  });
  const attrs = `name="${xmlEscape(suiteName)}" tests="${results.length}" failures="${failures}" errors="0" skipped="${skipped}"`;
  return `<?xml version="1.0" encoding="UTF-8"?>\n<testsuites ${attrs}>\n  <testsuite ${attrs}>\n${cases.join('\n')}\n  </testsuite>\n</testsuites>\n`;
}

const md = (s: string) => s.replace(/\\/g, '\\\\').replace(/\|/g, '\\|').replace(/\r?\n/g, '<br>');
const mass = (r: MarkRecord | null) => (r === null ? '–' : r.lightestMass === null ? 'none' : r.lightestMass.toFixed(1));

/** A Markdown summary: counts by status, then one table row per mark that is not 'pass' (all marks with `all`). */
export function toMarkdown(results: readonly CompareResult[], opts: { title?: string; all?: boolean } = {}): string {
  const order: CompareStatus[] = ['regressed', 'changed', 'new', 'removed', 'pass'];
  const counts = order.map((s) => `${results.filter((r) => r.status === s).length} ${s}`).join(', ');
  const rows = results.filter((r) => opts.all || r.status !== 'pass');
  const lines = [`## ${md(opts.title ?? 'Girder schedule regression')}`, '', `${results.length} marks: ${counts}.`, ''];
  if (rows.length === 0) lines.push('No mark changed.');
  else {
    lines.push('| Mark | Status | Lightest, kg (baseline → current) | Governing (baseline → current) | Reasons |', '|---|---|---:|---|---|');
    for (const r of rows) {
      const gov = `${r.baseline?.lightestGoverning ?? '–'} → ${r.current?.lightestGoverning ?? '–'}`;
      lines.push(`| ${md(r.mark)} | ${r.status} | ${mass(r.baseline)} → ${mass(r.current)} | ${md(gov)} | ${md(r.reasons.join('; '))} |`);
    }
  }
  return lines.join('\n') + '\n';
}
