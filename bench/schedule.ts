/**
 * `pnpm bench:schedule` (or `node --conditions=@platesmith/source --import tsx bench/schedule.ts`):
 * a schedule of 200 marks of an invented project (spans, loads, quantities drawn by a seeded
 * generator, so every run is the same schedule; modest spaces per mark), run through the search
 * on one worker pool, then finished (tonnage, plate list, comparison with itself as baseline).
 * Prints the wall time and marks per second; target on 2 cores: under 60 s. Never asserted.
 * `--json`: one JSON line. `--marks=N`: another count.
 */
import { availableParallelism } from 'node:os';
import { finishSchedule, parseSchedule, runSchedule } from '../packages/schedule/src/index.js';
import { createSearchPool, pingPool, searchOnPool } from '@platesmith/search/pool';

const json = process.argv.includes('--json');
const count = Number(process.argv.find((a) => a.startsWith('--marks='))?.slice(8) ?? 200);

/** mulberry32: a small seeded generator (common practice, no source needed: any fixed PRNG will do). */
function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** The invented project: floor and roof girders of a logistics hall, 6 to 18 m, one or two spans. */
export function benchSchedule(n: number, seed = 20261201): Record<string, unknown> {
  const r = rng(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(r() * xs.length)]!;
  const girders = Array.from({ length: n }, (_, i) => {
    const span = 6000 + 500 * Math.floor(r() * 25); // 6 … 18 m
    const two = r() < 0.2;
    const g = 5 + Math.round(r() * 150) / 10; // 5 … 20 kN/m
    const q = 5 + Math.round(r() * 200) / 10; // 5 … 25 kN/m
    return {
      mark: `H${String(i + 1).padStart(3, '0')}`,
      quantity: 1 + Math.floor(r() * 12),
      spans: two ? [span, Math.round((span * (0.6 + 0.4 * r())) / 100) * 100] : [span],
      actions: [
        { kind: 'permanent', load: 'udl', value: g },
        { kind: 'variable', load: 'udl', value: q, category: pick(['B', 'C', 'E'] as const) },
      ],
      options: { restraint: pick(['continuous', { spacing: 3000 }, { spacing: 4000 }] as const) },
    };
  });
  return {
    name: `invented logistics hall, ${n} marks`,
    defaults: {
      space: {
        webDepth: { min: 500, max: 1300, step: 100 },
        webThickness: [8, 10, 12],
        flangeWidth: { min: 200, max: 450, step: 50 },
        flangeThickness: [12, 15, 20, 25, 30],
        panels: [0, 4],
        endPost: 'rigid',
      },
    },
    tender: { rates: { S355: 1.4 } },
    girders,
  };
}

const parsed = parseSchedule(benchSchedule(count));
if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('\n'));
const schedule = parsed.value;
const pool = createSearchPool();
await pingPool(pool);
try {
  const t0 = performance.now();
  const run = await runSchedule(schedule, { search: (t, s) => searchOnPool(pool, t, s ? { signal: s } : {}) });
  const t1 = performance.now();
  const result = finishSchedule({ ...schedule, baseline: { records: run.marks.map((m) => ({ mark: m.mark, lightestMass: m.search?.lightest?.mass ?? null, lightestGoverning: m.search?.lightest?.governing.id ?? null })) } }, run.marks);
  const t2 = performance.now();
  const row = {
    bench: 'schedule',
    marks: run.marks.length,
    marksFailed: result.totals.marksFailed,
    marksWithoutFeasible: result.totals.marksWithoutFeasible.length,
    candidatesPerMark: run.marks[0]?.search?.stats.spaceSize ?? null,
    cores: availableParallelism(),
    searchWallS: Math.round((t1 - t0) / 10) / 100,
    finishWallS: Math.round((t2 - t1) / 10) / 100,
    wallS: Math.round((t2 - t0) / 10) / 100,
    marksPerSecond: Math.round((run.marks.length / ((t2 - t0) / 1000)) * 100) / 100,
    tonnageT: result.tender.tonnage ? Math.round(result.tender.tonnage.total) / 1000 : null,
    unchangedAgainstItself: result.comparison?.counts.pass ?? null,
  };
  if (json) process.stdout.write(JSON.stringify(row) + '\n');
  else {
    process.stdout.write(
      `schedule-${row.marks}-marks\n  ${row.marks} marks (${row.marksFailed} failed, ${row.marksWithoutFeasible} without a feasible section), about ${row.candidatesPerMark} candidates per mark, ${row.cores} cores\n` +
        `  wall ${row.wallS} s (search ${row.searchWallS} s, tonnage and comparison ${row.finishWallS} s): ${row.marksPerSecond} marks/s (target: under 60 s on 2 cores); tender tonnage ${row.tonnageT} t\n`,
    );
  }
} finally {
  await pool.close();
}
