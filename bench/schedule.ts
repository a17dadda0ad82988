/**
 * `pnpm bench:schedule` (or `node --conditions=@platesmith/source --import tsx bench/schedule.ts`):
 * invented schedules of 200 and 500 marks (spans, loads, quantities drawn by a seeded generator,
 * so every run is the same schedule; modest spaces per mark), run through the search on one worker
 * pool, then finished: tonnage (what it covers, the marks without a section and their flagged
 * estimates), comparison with itself as baseline, and the rationalisation to K = 1 … 15 sections
 * and to at most 4 plate thicknesses and 3 flange widths, with the time of its checks and solves
 * and each K's optimality gap. Targets on 2 cores: the 200-mark search under 60 s; its
 * rationalisation optimal, or within 1 %, in under 60 s. Printed, never asserted.
 * `--json`: one JSON line per schedule. `--marks=N`: one schedule of N marks.
 * `--time-limit=S`: the rationalisation's time limit (default 60 s).
 */
import { availableParallelism, loadavg } from 'node:os';
import { finishSchedule, parseSchedule, runSchedule } from '../packages/schedule/src/index.js';
import { createSearchPool, pingPool, searchOnPool } from '@platesmith/search/pool';
import { benchSchedule } from './schedule-data.js';

const json = process.argv.includes('--json');
const one = process.argv.find((a) => a.startsWith('--marks='))?.slice(8);
const counts = one !== undefined ? [Number(one)] : [200, 500];
const timeLimit = Number(process.argv.find((a) => a.startsWith('--time-limit='))?.slice(13) ?? 60);
const maxK = 15;
const round = (v: number, d = 2) => Math.round(v * 10 ** d) / 10 ** d;

const pool = createSearchPool();
await pingPool(pool);
try {
  for (const count of counts) {
    const parsed = parseSchedule(benchSchedule(count));
    if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('\n'));
    const schedule = { ...parsed.value, tender: { ...parsed.value.tender!, rationalise: maxK, plates: { thicknesses: 4, widths: 3 }, timeLimit } };
    const t0 = performance.now();
    const run = await runSchedule(schedule, { search: (t, s) => searchOnPool(pool, t, s ? { signal: s } : {}) });
    const t1 = performance.now();
    const baseline = { records: run.marks.map((m) => ({ mark: m.mark, lightestMass: m.search?.lightest?.mass ?? null, lightestGoverning: m.search?.lightest?.governing.id ?? null })) };
    const result = await finishSchedule({ ...schedule, baseline }, run.marks);
    const t2 = performance.now();
    const rat = result.tender.rationalisation;
    if (!rat || rat.skipped !== undefined) throw new Error(`rationalisation skipped: ${rat?.skipped}`);
    const cov = result.tender.coverage;
    const row = {
      bench: 'schedule',
      marks: run.marks.length,
      marksFailed: result.totals.marksFailed,
      marksWithoutFeasible: result.totals.marksWithoutFeasible.length,
      candidatesPerMark: run.marks[0]?.search?.stats.spaceSize ?? null,
      cores: availableParallelism(),
      // the host's load when the figures were taken: on a shared machine they swing with it
      loadAverage: round(loadavg()[0]!, 1),
      searchWallS: round((t1 - t0) / 1000),
      finishWallS: round((t2 - t1) / 1000),
      marksPerSecond: round(run.marks.length / ((t1 - t0) / 1000)),
      tonnageT: round(cov.tonnage / 1000, 3),
      excludedMarks: cov.excludedMarks,
      excludedGirders: cov.excludedGirders,
      estimatedT: round(cov.estimated / 1000, 3),
      shortMarks: cov.short.length,
      unchangedAgainstItself: result.comparison?.counts.pass ?? null,
      rationalisation: {
        marksInModel: rat.model.marks,
        leftOut: rat.leftOut.length,
        groups: rat.model.groups,
        candidates: rat.candidates,
        candidatesKept: rat.model.candidatesKept,
        pairs: rat.model.pairs,
        checksS: round(rat.checkSeconds),
        solvesS: round(rat.seconds),
        timeLimitS: rat.timeLimit,
        byK: rat.byK.map((k) => (k.feasible ? { K: k.K, totalT: round(k.total / 1000, 3), penaltyPct: round(k.penaltyRatio * 100), gapPct: round(k.gap * 100, 3), status: k.status, source: k.source, s: round(k.seconds) } : { K: k.K, status: k.status, reason: k.reason })),
        plates: rat.plates && rat.plates.feasible ? { totalT: round(rat.plates.total / 1000, 3), penaltyPct: round(rat.plates.penaltyRatio * 100), gapPct: round(rat.plates.gap * 100, 3), status: rat.plates.status, thicknesses: rat.plates.thicknesses, widths: rat.plates.widths, s: round(rat.plates.seconds) } : rat.plates,
      },
    };
    if (json) {
      process.stdout.write(JSON.stringify(row) + '\n');
      continue;
    }
    const r = row.rationalisation;
    const worst = Math.max(...rat.byK.map((k) => (k.feasible ? k.gap : 1)));
    const lines = [
      `schedule-${row.marks}-marks`,
      `  ${row.marks} marks (${row.marksFailed} failed, ${row.marksWithoutFeasible} without a feasible section), about ${row.candidatesPerMark} candidates per mark, ${row.cores} cores, load average ${row.loadAverage}`,
      `  search ${row.searchWallS} s: ${row.marksPerSecond} marks/s (target: under 60 s for 200 marks on 2 cores); finish (tonnage, comparison, rationalisation) ${row.finishWallS} s`,
      `  tonnage ${row.tonnageT} t; not in it: ${row.excludedMarks} marks (${row.excludedGirders} girders), flagged estimates ${row.estimatedT} t, ${row.shortMarks} marks without an estimate`,
      `  rationalisation: ${r.marksInModel} marks in the model (${r.leftOut} left out) in ${r.groups} groups, ${r.candidatesKept} of ${r.candidates} candidates kept, ${r.pairs} feasible pairs`,
      `  rationalisation time: checks ${r.checksS} s, solves ${r.solvesS} s (limit ${r.timeLimitS} s); largest gap ${round(worst * 100, 3)} % (target: optimal or within 1 % in under 60 s for 200 marks)`,
      ...rat.byK.map((k) => (k.feasible ? `    K = ${String(k.K).padStart(2)}: ${round(k.total / 1000, 3)} t, penalty ${round(k.penaltyRatio * 100)} %, gap ${round(k.gap * 100, 3)} % (${k.status}, ${k.source}, ${round(k.seconds)} s)` : `    K = ${String(k.K).padStart(2)}: ${k.reason}`)),
      rat.plates
        ? rat.plates.feasible
          ? `    plates (≤ 4 thicknesses, ≤ 3 flange widths): ${round(rat.plates.total / 1000, 3)} t, penalty ${round(rat.plates.penaltyRatio * 100)} %, gap ${round(rat.plates.gap * 100, 3)} % (${rat.plates.status}, ${round(rat.plates.seconds)} s); thicknesses ${rat.plates.thicknesses.join(', ')} mm, widths ${rat.plates.widths.join(', ')} mm`
          : `    plates: ${rat.plates.reason}`
        : '',
    ];
    process.stdout.write(lines.filter(Boolean).join('\n') + '\n');
  }
} finally {
  await pool.close();
}
