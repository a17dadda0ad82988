import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { createSearchPool, searchOnPool } from '@platesmith/search/pool';
import { formatIssues, parseWith, publishSearch, SearchInput, toSearchTask, type PublishedSearch } from '@platesmith/schema';
import { EXIT, InputError, type Out } from '../io.js';
import { caution } from '../render.js';
import { renderSearch } from './search.js';

/** The bundled demo: an invented project of several girders (demo/kestrel-quay.json). */
export const DEMO_FILE = fileURLToPath(new URL('../../../../demo/kestrel-quay.json', import.meta.url));

interface DemoGirder {
  mark: string;
  description: string;
  [k: string]: unknown;
}

export async function runDemo(json: boolean, io: Out, file = DEMO_FILE): Promise<number> {
  const demo = JSON.parse(readFileSync(file, 'utf8')) as { project: string; defaults: Record<string, unknown>; girders: DemoGirder[] };
  const pool = createSearchPool();
  const results: { mark: string; description: string; result: PublishedSearch }[] = [];
  try {
    if (!json) io.out(`${demo.project}\n`);
    for (const g of demo.girders) {
      const { mark, description, ...fields } = g;
      const input = { ...demo.defaults, ...fields, options: { ...(demo.defaults['options'] as object), ...((fields['options'] as object) ?? {}) } };
      const parsed = parseWith(SearchInput, input);
      if (!parsed.ok) throw new InputError(`${mark}: ${formatIssues(parsed.issues)}`);
      const task = toSearchTask(parsed.value);
      const r = publishSearch(await searchOnPool(pool, task), task.objective, task.analysis.length, task.assumptions);
      results.push({ mark, description, result: r });
      if (!json) io.out(`${renderSearch(r, `${mark} — ${description} (spans ${(parsed.value.spans ?? []).map((s) => s / 1000).join(' + ')} m)`)}\n`);
    }
  } finally {
    await pool.close();
  }
  if (json) io.out(JSON.stringify({ project: demo.project, girders: results }, null, 2));
  else {
    const total = results.reduce((t, r) => t + (r.result.lightest?.mass ?? 0), 0);
    io.out(`Lightest girders of the demo: ${(total / 1000).toFixed(2)} t of steel for one of each mark.\n\n${caution()}`);
  }
  return results.every((r) => r.result.pareto.length > 0) ? EXIT.ok : EXIT.fails;
}
