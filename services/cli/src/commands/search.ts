import { createEngine } from '@platesmith/app';
import { edgeNote, formatIssues, parseWith, SearchInput, type PublishedPoint, type PublishedSearch } from '@platesmith/schema';
import { EXIT, InputError, type Out } from '../io.js';
import { caution, renderAssumptions } from '../render.js';
import { count, fmt, progressBar, table, TABLE_WIDTH } from '../table.js';

/**
 * Progress of a search on standard error, by work done: candidates settled (judged, or ruled out by
 * a bound or the fabrication rules) out of the space, with the time taken and an estimate of the
 * time left. A bar on a terminal; otherwise one plain line per tenth of the work. The estimate is
 * rough: bounds rule out large parts of the space at once, most of them near the end.
 */
export function searchProgress(io: Out, quiet: boolean, tty = process.stderr.isTTY === true): (settled: number, size: number) => void {
  const t0 = performance.now();
  let lastTenth = -1;
  return (settled, size) => {
    if (quiet || size <= 0) return;
    const f = Math.min(1, settled / size);
    const s = (performance.now() - t0) / 1000;
    const left = f > 0 && f < 1 ? `, about ${Math.ceil((s / f) * (1 - f))} s left` : '';
    const line = `${count(settled)} of ${count(size)} candidates settled (${(f * 100).toFixed(f < 1 ? 1 : 0)} %, ${s.toFixed(1)} s${left})`;
    if (tty) process.stderr.write(`\r${progressBar(settled, size)} ${line}`.padEnd(100) + (f >= 1 ? '\n' : ''));
    else {
      const tenth = Math.floor(f * 10);
      if (tenth === lastTenth) return;
      lastTenth = tenth;
      io.err(`[search] ${line}`);
    }
  };
}

/** The search of one input on a fresh engine (its own worker pool), within `budgetMs` when given. */
export async function solve(input: unknown, opts: { threads?: number; budgetMs?: number; onProgress?: (settled: number, size: number) => void } = {}): Promise<PublishedSearch> {
  const parsed = parseWith(SearchInput, input);
  if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
  const engine = createEngine(opts.threads !== undefined ? { threads: opts.threads } : {});
  try {
    return await engine.search(parsed.value, {
      ...(opts.budgetMs !== undefined ? { budgetMs: opts.budgetMs } : {}),
      ...(opts.onProgress ? { onProgress: opts.onProgress } : {}),
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
        ['depth (mm)', 'mass (kg)', 'kg/m', ...(r.objective === 'cost' ? [unit] : []), 'section', 'governing check', ...(wide ? ['clause'] : []), 'util.', ...(wide ? ['not lighter because'] : [])],
        r.pareto.map((p) => [
          p.depth,
          fmt(p.mass, 5),
          fmt(p.massPerMetre, 4),
          ...(r.objective === 'cost' ? [fmt(p.value, 5)] : []),
          describe(p.section),
          p.governing.id,
          ...(wide ? [p.governing.clause] : []),
          p.governing.utilisation?.toFixed(3) ?? 'inf',
          ...(wide ? [limitsText(p.limitedBy, r.objective)] : []),
        ]),
        ['r', 'r', 'r', ...(r.objective === 'cost' ? ['r' as const] : []), 'l', 'l', ...(wide ? ['l' as const] : []), 'r', ...(wide ? ['l' as const] : [])],
        max,
      ),
    );
    if (wide) lines.push(`not lighter because: each one-step lighter change (${LIMIT_LEGEND}) and the check that fails it with its utilisation; "heavier": it passes but is no ${r.objective === 'cost' ? 'cheaper' : 'lighter'} overall`);
    const l = r.lightest!;
    lines.push('', `Lightest${r.objective === 'cost' ? ' (cheapest)' : ''}: ${describe(l.section)} — ${fmt(l.mass, 5)} kg, depth ${l.depth} mm, governed by ${l.governing.id} (${l.governing.clause}) at ${l.governing.utilisation?.toFixed(3)}`);
    for (const x of l.limitedBy ?? []) lines.push(`  ${x.change} mm: ${limitWords(x, r.objective)}`);
    const edge = edgeNote(r);
    if (edge) lines.push(`  Note: ${edge}.`);
  }
  const s = r.stats;
  const assumed = renderAssumptions(r.assumptions ?? []);
  if (assumed) lines.push('', assumed.trimEnd());
  lines.push('', `Searched ${count(s.spaceSize)} candidates exactly: ${count(s.fullEvaluations)} judged (${((s.fullEvaluations / Math.max(1, s.spaceSize)) * 100).toPrecision(2)} %), the rest pruned by bounds (depth ${s.pruned.depth}, shear ${s.pruned.shear}, bending ${s.pruned.bending}, flange-induced buckling ${s.pruned.flangeInducedBuckling}, deflection ${s.pruned.deflection}, patch loading ${s.pruned.patchLoading}, patch loading with bending ${s.pruned.patchBending}, lateral-torsional buckling from the moment envelope ${s.pruned.lateralTorsional}, bearing stiffener ${s.pruned.bearing}, shared with a failed candidate of the same plates ${s.pruned.sameFlanges}, stiffener layout failed on another flange ${s.pruned.webOnly}, incumbent ${s.pruned.incumbent}, rules ${s.pruned.rules}); ${s.wallMs.toFixed(0)} ms on ${s.workers} workers.`);
  return lines.join('\n');
}

const LIMIT_SHORT: Record<NonNullable<PublishedPoint['limitedBy']>[number]['move'], string> = {
  'web-thickness': 'tw−',
  'flange-thickness': 'tf−',
  'top-flange-thickness': 'tf,top−',
  'bottom-flange-thickness': 'tf,bot−',
  'flange-width': 'bf−',
  'top-flange-width': 'bf,top−',
  'bottom-flange-width': 'bf,bot−',
  'fewer-panels': 'panels−',
  'lighter-flats': 'flats−',
  'one-side': '1 side',
  'no-load-stiffeners': 'no load st.',
  'lighter-load-flats': 'load flats−',
};
const LIMIT_LEGEND = 'tw− thinner web, tf− thinner flanges, bf− narrower flanges, panels− fewer panels, flats− lighter flats, 1 side: stiffeners on one side, no load st.: no load-bearing stiffeners, load flats− lighter load-bearing flats';

/** A point's limitedBy in a table cell: the lighter changes the space holds, and what rules each out. */
export function limitsText(limits: PublishedPoint['limitedBy'], objective: PublishedSearch['objective']): string {
  if (!limits) return '—';
  if (limits.length === 0) return 'no lighter plate in the space';
  const cells = limits.filter((l) => l.outcome !== 'outside-space').map((l) => `${LIMIT_SHORT[l.move]} ${l.outcome === 'fails' ? `${l.check} ${l.utilisation?.toFixed(2) ?? 'inf'}` : l.outcome === 'not-lighter' ? (objective === 'cost' ? 'costlier' : 'heavier') : 'PASSES'}`);
  return cells.length > 0 ? cells.join('; ') : 'nothing lighter in the space';
}

/** One limit in words. */
function limitWords(l: NonNullable<PublishedPoint['limitedBy']>[number], objective: PublishedSearch['objective']): string {
  if (l.outcome === 'fails') return `fails ${l.check} (${l.clause}) at ${l.utilisation?.toFixed(3) ?? 'an unbounded utilisation'}`;
  if (l.outcome === 'not-lighter') return `passes, but is no ${objective === 'cost' ? 'cheaper' : 'lighter'} overall (${fmt(l.value ?? 0, 5)} ${objective === 'cost' ? 'cost units' : 'kg'})`;
  if (l.outcome === 'outside-space') return `not in the space (${l.reason})`;
  return 'passes and is lighter: please report this answer (the search is meant to be exact)';
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
