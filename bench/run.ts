/**
 * `pnpm bench`: figures for the search on the reference problems (bench/problems.ts), printed, not
 * asserted. Targets on 2 cores: symmetric problems under 200 ms each, the mono-symmetric one under
 * 2 s, full evaluations under 1/1000 of the space. `--json`: one JSON object per line.
 * Wall time: the median of 5 runs on the pool after 8 warm-up runs (the service is long-lived: the
 * workers' compiled code is warm after a few searches), with the first run printed beside it — the
 * first search of that problem on a pool already warmed up by warmPool (what a user of a running
 * service waits for a problem it has not seen);
 * the mono-symmetric problem (seconds per run) gets 4 warm-up runs instead of 8.
 */
import { parseWith, SearchInput, toSearchTask } from '@platesmith/schema';
import { bruteForce, problemOf, search } from '@platesmith/search';
import { createSearchPool, pingPool, searchOnPool, warmPool } from '@platesmith/search/pool';
import { machineLine, machineReference } from './machine.js';
import { PROBLEMS } from './problems.js';

const json = process.argv.includes('--json');
const only = process.argv.find((a) => a.startsWith('--only='))?.slice(7);

function task(input: Record<string, unknown>) {
  const p = parseWith(SearchInput, input);
  if (!p.ok) throw new Error(JSON.stringify(p.issues));
  return toSearchTask(p.value, 1e12);
}

const machine = await machineReference();
if (!json) process.stdout.write(machineLine(machine) + '\n');

const pool = createSearchPool();
await pingPool(pool);
const warmUpMs = await warmPool(pool, 2);
if (!json) process.stdout.write(`pool of ${pool.threads} workers warmed up in ${Math.round(warmUpMs)} ms (small invented searches, as the service does at start)\n`);
try {
  for (const prob of PROBLEMS) {
    if (only && !prob.name.includes(only)) continue;
    const t = task(prob.input);
    const long = prob.name.includes('mono');
    const first = await searchOnPool(pool, t);
    for (let i = 1; i < (long ? 4 : 8); i++) await searchOnPool(pool, t); // warm-up: compiled code in the workers (about 8 searches)
    const timed: Awaited<ReturnType<typeof searchOnPool>>[] = [];
    for (let i = 0; i < 5; i++) timed.push(await searchOnPool(pool, t));
    timed.sort((a, b) => a.stats.wallMs - b.stats.wallMs);
    const r = timed[timed.length >> 1]!;
    // brute force against the exact search on a space small enough for brute force (same problem)
    const small = task({ ...prob.input, space: { ...(prob.input['space'] as object), ...prob.small } });
    const sp = problemOf(small);
    search(sp); // warm-up
    const s0 = performance.now();
    const fast = search(sp);
    const s1 = performance.now();
    const brute = bruteForce(sp);
    const s2 = performance.now();
    const same = JSON.stringify(fast.pareto.map((e) => [e.depth, e.value])) === JSON.stringify(brute.front.map((e) => [e.depth, e.value]));
    const row = {
      problem: prob.name,
      spaceSize: r.stats.spaceSize,
      fullEvaluations: r.stats.fullEvaluations,
      wallMs: Math.round(r.stats.wallMs * 10) / 10,
      firstWallMs: Math.round(first.stats.wallMs),
      timedRuns: timed.length,
      workers: r.stats.workers,
      bruteForceRatio: Math.round(((s1 - s0) / (s2 - s1)) * 1e5) / 1e5,
      paretoPoints: r.pareto.length,
      lightestKg: r.lightest ? Math.round(r.lightest.mass) : null,
      evaluationsPerCandidate: r.stats.fullEvaluations / r.stats.spaceSize,
      smallSpace: fast.stats.spaceSize,
      smallSearchMs: Math.round((s1 - s0) * 10) / 10,
      smallBruteMs: Math.round(s2 - s1),
      smallSameFront: same,
      ...machine,
    };
    if (json) process.stdout.write(JSON.stringify(row) + '\n');
    else {
      process.stdout.write(
        `${prob.name}\n  space ${row.spaceSize.toExponential(2)} candidates, ${row.fullEvaluations} judged in full (${(row.evaluationsPerCandidate * 1000).toFixed(3)} per 1000), ` +
          `${row.wallMs} ms on ${row.workers} workers (median of ${row.timedRuns}; first run of this problem ${row.firstWallMs} ms); Pareto ${row.paretoPoints} points, lightest ${row.lightestKg} kg\n` +
          `  brute force on a ${row.smallSpace}-candidate space of the same problem: ${row.smallBruteMs} ms vs search ${row.smallSearchMs} ms (ratio ${row.bruteForceRatio}), same front: ${row.smallSameFront}\n`,
      );
    }
  }
} finally {
  await pool.close();
}
