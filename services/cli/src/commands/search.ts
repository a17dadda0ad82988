import { createEngine } from '@platesmith/app';
import { formatIssues, parseWith, SearchInput, type PublishedSearch } from '@platesmith/schema';
import { EXIT, InputError, type Out } from '../io.js';
import { caution, renderAssumptions } from '../render.js';
import { count, fmt, progressBar, table, TABLE_WIDTH } from '../table.js';

/** Progress of a search on standard error: a bar on a terminal, one plain line per step otherwise. */
export function searchProgress(io: Out, quiet: boolean, tty = process.stderr.isTTY === true): (done: number, total: number) => void {
  const t0 = performance.now();
  return (done, total) => {
    if (quiet) return;
    const s = (performance.now() - t0) / 1000;
    const left = done < total ? `, about ${Math.ceil((s / done) * (total - done))} s left` : '';
    const line = `${done}/${total} parts of the space searched (${s.toFixed(1)} s${left})`;
    if (tty) process.stderr.write(`\r${progressBar(done, total)} ${line}`.padEnd(100) + (done === total ? '\n' : ''));
    else io.err(`[search] ${line}`);
  };
}

/** The search of one input on a fresh engine (its own worker pool), within `budgetMs` when given. */
export async function solve(input: unknown, opts: { threads?: number; budgetMs?: number; onProgress?: (done: number, total: number) => void } = {}): Promise<PublishedSearch> {
  const parsed = parseWith(SearchInput, input);
  if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
  const engine = createEngine(opts.threads !== undefined ? { threads: opts.threads } : {});
  try {
    return await engine.search(parsed.value, {
      ...(opts.budgetMs !== undefined ? { budgetMs: opts.budgetMs } : {}),
      ...(opts.onProgress ? { onSlice: opts.onProgress } : {}),
    });
  } finally {
    await engine.close();
  }
}

/** The line a search that was not exact prints on standard error. */
export function statusWarning(r: PublishedSearch): string | null {
  return r.status === 'aborted' ? `warning: ${r.message}` : null;
}

export function renderSearch(r: PublishedSearch, title?: string, wide = false): string {
  const max = wide ? Infinity : TABLE_WIDTH;
  const lines: string[] = [];
  if (title) lines.push(title, '');
  if (r.status === 'aborted') lines.push(`Search ${r.message}.`, '');
  if (r.pareto.length === 0) {
    lines.push(r.status === 'aborted' ? 'No section found before the search stopped.' : 'No section in the space passes every check.');
    if (r.nearMisses.length) {
      lines.push('', 'Nearest misses:');
      lines.push(
        table(
          ['depth (mm)', 'mass (kg)', 'section', 'governing', 'util.', 'failing'],
          r.nearMisses.map((m) => [m.depth, fmt(m.mass, 5), describe(m.section), m.governing.id, m.governing.utilisation?.toFixed(3) ?? 'inf', m.failing.join(', ')]),
          ['r', 'r', 'l', 'l', 'r', 'l'],
          max,
        ),
      );
    }
  } else {
    const unit = r.objective === 'mass' ? 'kg' : 'cost';
    lines.push(`Pareto set: overall depth against ${r.objective} (each row: nothing shallower or as shallow is lighter)`);
    lines.push(
      table(
        ['depth (mm)', 'mass (kg)', 'kg/m', ...(r.objective === 'cost' ? [unit] : []), 'section', 'governing check', ...(wide ? ['clause'] : []), 'util.'],
        r.pareto.map((p) => [
          p.depth,
          fmt(p.mass, 5),
          fmt(p.massPerMetre, 4),
          ...(r.objective === 'cost' ? [fmt(p.value, 5)] : []),
          describe(p.section),
          p.governing.id,
          ...(wide ? [p.governing.clause] : []),
          p.governing.utilisation?.toFixed(3) ?? 'inf',
        ]),
        ['r', 'r', 'r', ...(r.objective === 'cost' ? ['r' as const] : []), 'l', 'l', ...(wide ? ['l' as const] : []), 'r'],
        max,
      ),
    );
    const l = r.lightest!;
    lines.push('', `Lightest${r.objective === 'cost' ? ' (cheapest)' : ''}: ${describe(l.section)} — ${fmt(l.mass, 5)} kg, depth ${l.depth} mm, governed by ${l.governing.id} (${l.governing.clause}) at ${l.governing.utilisation?.toFixed(3)}`);
  }
  const s = r.stats;
  const assumed = renderAssumptions(r.assumptions ?? []);
  if (assumed) lines.push('', assumed.trimEnd());
  lines.push('', `Searched ${count(s.spaceSize)} candidates exactly: ${count(s.fullEvaluations)} judged (${((s.fullEvaluations / Math.max(1, s.spaceSize)) * 100).toPrecision(2)} %), the rest pruned by bounds (depth ${s.pruned.depth}, shear ${s.pruned.shear}, bending ${s.pruned.bending}, flange-induced buckling ${s.pruned.flangeInducedBuckling}, deflection ${s.pruned.deflection}, patch loading ${s.pruned.patchLoading}, patch loading with bending ${s.pruned.patchBending}, lateral-torsional buckling from the moment envelope ${s.pruned.lateralTorsional}, bearing stiffener ${s.pruned.bearing}, shared with a failed candidate of the same plates ${s.pruned.sameFlanges}, stiffener layout failed on another flange ${s.pruned.webOnly}, incumbent ${s.pruned.incumbent}, rules ${s.pruned.rules}); ${s.wallMs.toFixed(0)} ms on ${s.workers} workers.`);
  return lines.join('\n');
}

/** Short plate description: web hw×tw, flanges b×t, stiffeners, end post, grade. */
export function describe(s: PublishedSearch['pareto'][number]['section']): string {
  const fl = (f: { width: number; thickness: number }) => `${f.width}×${f.thickness}`;
  const same = s.topFlange.width === s.bottomFlange.width && s.topFlange.thickness === s.bottomFlange.thickness;
  const flanges = same ? `2 fl ${fl(s.topFlange)}` : `top ${fl(s.topFlange)} / bot ${fl(s.bottomFlange)}`;
  // without intermediate stiffeners the bearing stiffeners and the end post are still there (and their checks can govern)
  const st = s.stiffeners ? `stiff ${s.stiffeners.width}×${s.stiffeners.thickness} @${Math.round(s.stiffeners.spacing)}${s.stiffeners.sides === 1 ? ' 1-side' : ''}` : 'no intermediate';
  const b = s.bearing;
  const brg = b ? `, bearing ${(b.pairs ?? 1) > 1 ? `${b.pairs}× ` : ''}${b.width}×${b.thickness}` : '';
  const gs = s.grade ?? 'S355';
  const grade = typeof gs === 'string' ? gs : `${gs.web}/${gs.flanges}`;
  return `web ${s.web.depth}×${s.web.thickness}, ${flanges}, ${st}${brg}, ${s.endPost ?? 'rigid'} end post, ${grade}`;
}

/**
 * `search`: exit 0 with a Pareto set (exact, or aborted at its budget with a warning on standard
 * error), 1 when the whole space was searched and nothing passes.
 */
export async function runSearch(input: unknown, json: boolean, io: Out, opts: { wide?: boolean; quiet?: boolean; budgetMs?: number } = {}): Promise<number> {
  const r = await solve(input, { onProgress: searchProgress(io, opts.quiet ?? false), ...(opts.budgetMs !== undefined ? { budgetMs: opts.budgetMs } : {}) });
  const warn = statusWarning(r);
  if (warn) io.err(warn);
  if (json) io.out(JSON.stringify(r, null, 2));
  else io.out(`${renderSearch(r, undefined, opts.wide ?? false)}\n\n${caution()}`);
  return r.status === 'infeasible' ? EXIT.fails : EXIT.ok;
}
