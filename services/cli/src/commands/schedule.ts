import { readFileSync } from 'node:fs';
import { plateListCsv, scheduleReport } from '@platesmith/report';
import {
  BaselineJson,
  finishSchedule,
  parseScheduleText,
  runSchedule,
  toJUnit,
  toMarkdown,
  type CompareResult,
  type ScheduleJson,
  type ScheduleRunResult,
} from '@platesmith/schedule';
import { CAUTION, formatIssues, parseWith, SCOPE } from '@platesmith/schema';
import { createSearchPool, searchOnPool } from '@platesmith/search/pool';
import { EXIT, fileProblem, InputError, writeOut, type Out } from '../io.js';
import { caution } from '../render.js';
import { fmt, progressBar, table } from '../table.js';

export const SCHEDULE_USAGE = `platesmith schedule FILE [options]
  FILE                   a schedule: .json ({ defaults, girders }) or .csv (one row per mark); - for standard input
  --format json|csv      the format of FILE (default: from its extension, else json)
  --baseline PREV.json   compare every mark with a previous result (written by --out)
  --out result.json      write the result (the baseline of a later run)
  --junit out.xml        write JUnit XML, one test case per mark
  --markdown out.md      write a Markdown summary
  --report out.html      write the HTML report
  --plates plates.csv    write the plate list as CSV (product, grade, thickness, width, length, count, masses)
  --rationalise K        rationalise to at most K distinct sections (MILP, K = 1 … K)
  --mass-tolerance R     relative change of the lightest mass reported as a change (default 0.01)
  --threads N            search worker threads (default: the cores)
  --json                 print the result JSON instead of the summary
  --quiet                no progress lines on standard error
exit codes: 0 no regression, 1 a mark regressed against the baseline (without a baseline: an
adopted section fails or a mark could not be run), 2 bad input`;

export interface ScheduleArgs {
  file: string;
  format?: 'json' | 'csv';
  baseline?: string;
  out?: string;
  junit?: string;
  markdown?: string;
  report?: string;
  plates?: string;
  rationalise?: number;
  massTolerance?: number;
  threads?: number;
  json: boolean;
  quiet: boolean;
}

const VALUED = new Set(['--format', '--baseline', '--out', '--junit', '--markdown', '--report', '--plates', '--rationalise', '--mass-tolerance', '--threads']);
const SWITCHES = new Set(['--json', '--quiet']);

function numberArg(flag: string, v: string, opts: { integer?: boolean; min: number; max: number }): number {
  const n = Number(v);
  if (v.trim() === '' || !Number.isFinite(n) || (opts.integer && !Number.isInteger(n)) || n < opts.min || n > opts.max) {
    throw new InputError(`${flag} must be ${opts.integer ? 'a whole number' : 'a number'} from ${opts.min} to ${opts.max}, got '${v}'`);
  }
  return n;
}

/** Reads the arguments after `schedule`: FILE and the options (`--flag value` or `--flag=value`). */
export function parseScheduleArgs(argv: readonly string[]): ScheduleArgs {
  const values = new Map<string, string>();
  const switches = new Set<string>();
  const files: string[] = [];
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a.startsWith('--')) {
      const eq = a.indexOf('=');
      const flag = eq > 0 ? a.slice(0, eq) : a;
      if (SWITCHES.has(flag) && eq < 0) switches.add(flag);
      else if (VALUED.has(flag)) {
        const v = eq > 0 ? a.slice(eq + 1) : argv[++i];
        if (v === undefined || (eq < 0 && v.startsWith('--'))) throw new InputError(`${flag} needs a value\n\n${SCHEDULE_USAGE}`);
        values.set(flag, v);
      } else throw new InputError(`unknown option ${flag}\n\n${SCHEDULE_USAGE}`);
    } else files.push(a);
  }
  if (files.length === 0) throw new InputError(`no schedule file given\n\n${SCHEDULE_USAGE}`);
  if (files.length > 1) throw new InputError(`one schedule file, got ${files.length}: ${files.join(', ')}`);
  const out: ScheduleArgs = { file: files[0]!, json: switches.has('--json'), quiet: switches.has('--quiet') };
  const f = values.get('--format');
  if (f !== undefined) {
    if (f !== 'json' && f !== 'csv') throw new InputError(`--format must be json or csv, got '${f}'`);
    out.format = f;
  }
  for (const [flag, key] of [['--baseline', 'baseline'], ['--out', 'out'], ['--junit', 'junit'], ['--markdown', 'markdown'], ['--report', 'report'], ['--plates', 'plates']] as const) {
    const v = values.get(flag);
    if (v !== undefined) out[key] = v;
  }
  const k = values.get('--rationalise');
  if (k !== undefined) out.rationalise = numberArg('--rationalise', k, { integer: true, min: 1, max: 50 });
  const t = values.get('--mass-tolerance');
  if (t !== undefined) out.massTolerance = numberArg('--mass-tolerance', t, { min: 0, max: 1 });
  const th = values.get('--threads');
  if (th !== undefined) out.threads = numberArg('--threads', th, { integer: true, min: 1, max: 256 });
  return out;
}

function readText(file: string): string {
  try {
    return file === '-' ? readFileSync(0, 'utf8') : readFileSync(file, 'utf8');
  } catch (e) {
    throw new InputError(fileProblem(file, e));
  }
}

/** Writes an output, creating missing folders (`--report reports/harbour.html` on a fresh clone). */
const write = writeOut;

/** The schedule of FILE with the command line's baseline and options applied; bad input is an InputError listing every issue. */
export function loadSchedule(a: ScheduleArgs): ScheduleJson {
  const format = a.format ?? (/\.csv$/i.test(a.file) ? 'csv' : 'json');
  const parsed = parseScheduleText(readText(a.file), format);
  if (!parsed.ok) throw new InputError(`${a.file} is not a valid schedule:\n${parsed.issues.map((i) => `  ${i.message}`).join('\n')}`);
  const s: ScheduleJson = { ...parsed.value };
  if (a.baseline !== undefined) {
    let raw: unknown;
    try {
      raw = JSON.parse(readText(a.baseline));
    } catch (e) {
      if (e instanceof InputError) throw e;
      throw new InputError(`${a.baseline} is not valid JSON: ${(e as Error).message}`);
    }
    const b = parseWith(BaselineJson, raw);
    if (!b.ok) throw new InputError(`${a.baseline} is not a schedule result or a list of mark records:\n${formatIssues(b.issues)}`);
    s.baseline = b.value;
  }
  if (a.rationalise !== undefined) s.tender = { objective: 'mass', maxPairs: 20_000, ...s.tender, rationalise: a.rationalise };
  if (a.massTolerance !== undefined) s.compare = { massTolerance: a.massTolerance };
  return s;
}

/**
 * The JUnit cases of a run: the comparison with the baseline when there is one; without one,
 * a mark fails when its adopted section fails a check or the mark could not be run.
 */
export function junitCases(r: ScheduleRunResult): CompareResult[] {
  if (r.comparison) return r.comparison.results;
  return r.marks.map((m, i) => {
    const rec = r.records[i]!;
    const reasons: string[] = [];
    if (m.status === 'failed') reasons.push(`the mark could not be run: ${m.error?.message ?? 'failed'} (${m.error?.code ?? 'FAILED'})`);
    if (m.adopted && !m.adopted.passes) reasons.push(`adopted section fails (governing: ${m.adopted.governing.id}, utilisation ${m.adopted.governing.utilisation ?? 'inf'})`);
    return { mark: m.mark, status: reasons.length > 0 ? 'regressed' : 'pass', reasons, baseline: null, current: rec };
  });
}

/** A Markdown summary: the comparison (or the per-mark verdicts), then tonnage and rationalisation lines. */
export function markdownOf(r: ScheduleRunResult): string {
  const lines = [toMarkdown(junitCases(r), { title: `${r.name ?? 'Girder schedule'}: ${r.comparison ? 'regression against the baseline' : 'verdicts (no baseline)'}` })];
  const tl = tonnageLines(r);
  if (tl.length) lines.push(...tl, '');
  const rat = r.tender.rationalisation;
  if (rat && rat.skipped !== undefined) lines.push(`Rationalisation skipped: ${rat.skipped}.`, '');
  else if (rat) {
    lines.push('| K | total, t | penalty, t | penalty | sections |', '|---:|---:|---:|---:|---|');
    for (const k of rat.byK) {
      if (k.feasible) lines.push(`| ${k.K} | ${(k.total / 1000).toFixed(3)} | ${(k.penalty / 1000).toFixed(3)} | ${(k.penaltyRatio * 100).toFixed(2)} % | ${k.sections.length} |`);
      else lines.push(`| ${k.K} | – | – | – | ${k.reason.replace(/\|/g, '\\|')} |`);
    }
    lines.push('');
  }
  lines.push(`> **Caution.** ${r.caution ?? CAUTION}`, '>', `> ${r.scope ?? SCOPE}`, '');
  return lines.join('\n');
}

/** The HTML report of a result (the report package draws it). */
export function htmlOf(r: ScheduleRunResult, generatedAt: string, schedule?: ScheduleJson): string {
  return scheduleReport(r, { generatedAt, ...(schedule ? { schedule } : {}) });
}

/** Tonnage lines a tender estimator reads: the total counted, how it reconciles with the lightest sections, the cost with its currency. */
function tonnageLines(r: ScheduleRunResult): string[] {
  const t = r.tender.tonnage;
  if (!t) return [];
  const cur = r.tender.currency ? ` ${r.tender.currency}` : " (the rates' currency)";
  const lines = [`Tonnage counted (adopted where given, else lightest; bearing stiffeners included): ${(t.total / 1000).toFixed(3)} t over ${t.girders} girders${t.cost !== null ? `; material cost ${t.cost.toFixed(2)}${cur}` : ''}.`];
  const rec = r.tender.reconciliation;
  if (rec) {
    lines.push(`  = ${(rec.lightest / 1000).toFixed(3)} t on the lightest sections + ${(rec.saving / 1000).toFixed(3)} t that adopting the lightest would save.`);
    for (const m of rec.byMark) if (m.section === 'adopted' && m.saving !== null) lines.push(`  ${m.mark}: adopted ${m.perGirder.toFixed(1)} kg, lightest ${m.lightestPerGirder?.toFixed(1)} kg per girder; saving ${(m.saving / 1000).toFixed(3)} t for ${m.quantity}.`);
  }
  return lines;
}

function summary(r: ScheduleRunResult): string {
  const cmp = new Map((r.comparison?.results ?? []).map((c) => [c.mark, c]));
  const rows = r.marks.map((m) => [
    m.mark,
    m.quantity,
    m.status === 'failed' ? `failed (${m.error?.code ?? ''})` : 'ok',
    m.search?.lightest ? fmt(m.search.lightest.mass, 5) : '–',
    m.search?.lightest?.governing.id ?? '–',
    m.adopted ? (m.adopted.passes ? 'passes' : `FAILS (${m.adopted.governing.id})`) : '–',
    cmp.get(m.mark)?.status ?? '–',
  ]);
  const lines = [table(['mark', 'qty', 'run', 'lightest (kg)', 'governing', 'adopted', 'vs baseline'], rows, ['l', 'r', 'l', 'r', 'l', 'l', 'l'])];
  const tt = r.totals;
  lines.push('', `${tt.marks} marks (${tt.marksFailed} failed), ${tt.girders} girders.`);
  lines.push(...tonnageLines(r));
  if (r.comparison) {
    const c = r.comparison.counts;
    lines.push(`Against the baseline: ${c.regressed} regressed, ${c.changed} changed, ${c.new} new, ${c.removed} removed, ${c.pass} unchanged.`);
    for (const x of r.comparison.results.filter((x) => x.status === 'regressed')) lines.push(`  REGRESSED ${x.mark}: ${x.reasons.join('; ')}`);
  }
  const rat = r.tender.rationalisation;
  if (rat && rat.skipped !== undefined) lines.push(`Rationalisation skipped: ${rat.skipped}.`);
  else if (rat) {
    for (const k of rat.byK) lines.push(k.feasible ? `  K = ${k.K}: ${(k.total / 1000).toFixed(3)} t, penalty ${(k.penalty / 1000).toFixed(3)} t (${(k.penaltyRatio * 100).toFixed(2)} %)` : `  K = ${k.K}: ${k.reason}`);
  }
  return lines.join('\n');
}

/** Whether the run fails the nightly job: a regression, or (without a baseline) a failing adopted section or a mark that could not be run. */
export function failsRun(r: ScheduleRunResult): boolean {
  if (r.comparison) return r.comparison.regressed.length > 0;
  return r.marks.some((m) => m.status === 'failed' || (m.adopted !== null && !m.adopted.passes));
}

/** `schedule`: runs every mark, compares with the baseline, writes the outputs asked for. */
export async function runScheduleCommand(argv: readonly string[], io: Out): Promise<number> {
  const a = parseScheduleArgs(argv);
  const schedule = loadSchedule(a);
  const pool = createSearchPool(a.threads !== undefined ? { threads: a.threads } : {});
  let result: ScheduleRunResult;
  try {
    const run = await runSchedule(schedule, {
      search: (task, signal) => searchOnPool(pool, task, signal),
      onProgress: (p) => {
        if (a.quiet || !p.finished) return;
        const left = p.estimateMs === null ? '' : `, about ${Math.ceil(p.estimateMs / 1000)} s left`;
        const line = `${p.finished.mark} ${p.finished.status} (${(p.elapsedMs / 1000).toFixed(1)} s${left})`;
        // a progress bar on a terminal; plain lines when standard error is a file or a pipe
        if (process.stderr.isTTY) process.stderr.write(`\r${progressBar(p.marksDone, p.marksTotal)} ${line}`.padEnd(100) + (p.marksDone === p.marksTotal ? '\n' : ''));
        else io.err(`[${p.marksDone}/${p.marksTotal}] ${line}`);
      },
    });
    result = finishSchedule(schedule, run.marks);
  } finally {
    await pool.close();
  }
  if (a.out) write(a.out, JSON.stringify(result, null, 2) + '\n');
  if (a.junit) write(a.junit, toJUnit(junitCases(result), result.name ?? 'girder schedule regression'));
  if (a.markdown) write(a.markdown, markdownOf(result));
  if (a.report) write(a.report, htmlOf(result, new Date().toISOString(), schedule));
  if (a.plates) write(a.plates, result.tender.tonnage ? plateListCsv(result.tender.tonnage.plates) : plateListCsv([]));
  if (a.json) io.out(JSON.stringify(result, null, 2));
  else io.out(`${summary(result)}\n\n${caution()}`);
  return failsRun(result) ? EXIT.fails : EXIT.ok;
}

