/**
 * `pnpm bench:queue`: the queue backend against the embedded one, figures only (never asserted).
 * The invented 200-mark schedule of `pnpm bench:schedule` (bench/schedule-data.ts; `--marks=N` for
 * another size) run three ways, each from submit to its result stored:
 *   embedded: the API process's own pool of one thread (PLATESMITH_THREADS=1), no Redis;
 *   queue, 1 worker: `platesmith worker` processes of one thread each, Redis on a free loopback port;
 *   queue, 2 workers: the same with two worker processes.
 * Prints marks per second of each, and the queue's overhead per mark: (queue on 1 worker −
 * embedded) / marks, the same threads doing the same searches. The machine reference line is the
 * same fixed loop as `pnpm bench`'s (figures compare only beside it on a shared host).
 * `--json`: one JSON line. Needs redis-server (Debian's package).
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { availableParallelism, loadavg } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { buildApp } from '@platesmith/api';
import { parseSchedule, type ScheduleJson } from '@platesmith/schedule';
import { startRedis } from '../test/helpers/redis.js';
import { machineReference } from './machine.js';
import { benchSchedule } from './schedule-data.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..');
const json = process.argv.includes('--json');
const marks = Number(process.argv.find((a) => a.startsWith('--marks='))?.slice(8) ?? 200);
const round = (v: number, d = 2) => Math.round(v * 10 ** d) / 10 ** d;
const say = (s: string) => void (!json && process.stdout.write(s + '\n'));

const parsed = parseSchedule(benchSchedule(marks));
if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('\n'));
const schedule: ScheduleJson = parsed.value;

const machine = await machineReference();
say(`machine reference: a fixed loop takes ${machine.loopMsAlone} ms alone, ${machine.loopMsPaired} ms on two threads at once; load average ${round(loadavg()[0]!, 1)}, ${availableParallelism()} cores`);

/** submits the schedule to `app` and waits until it is done; seconds */
async function run(app: Awaited<ReturnType<typeof buildApp>>): Promise<number> {
  const t0 = performance.now();
  const job = await app.jobs.submit(schedule, null);
  for (;;) {
    const s = await app.jobs.store.get(job.id);
    if (s && ['done', 'failed', 'cancelled'].includes(s.status)) {
      if (s.status !== 'done') throw new Error(`the schedule ended ${s.status}: ${JSON.stringify(s.error)}`);
      return (performance.now() - t0) / 1000;
    }
    await new Promise((r) => setTimeout(r, 20));
  }
}

function workerProcess(env: Record<string, string>): Promise<ChildProcess> {
  const child = spawn(process.execPath, ['--conditions=@platesmith/source', '--import', 'tsx', 'services/cli/src/main.ts', 'worker'], {
    cwd: root,
    env: { ...process.env, ...env, PLATESMITH_THREADS: '1', LOG_LEVEL: 'warn' },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  return new Promise((resolve, reject) => {
    let err = '';
    child.stderr!.on('data', (d: Buffer) => {
      err += String(d);
      if (err.includes('taking marks from the queue')) resolve(child);
    });
    child.once('exit', (c) => reject(new Error(`worker exited ${c}: ${err.slice(-400)}`)));
  });
}

const redis = await startRedis();
const children: ChildProcess[] = [];
const rows: Record<string, number> = {};
try {
  const emb = await buildApp({ threads: 1, rateLimit: 0 });
  await emb.ready();
  rows['embeddedS'] = await run(emb);
  await emb.close();
  say(`embedded, 1 thread:        ${marks} marks in ${round(rows['embeddedS']!)} s, ${round(marks / rows['embeddedS']!)} marks/s`);
  for (const k of [1, 2]) {
    const prefix = `bench-${k}-${Date.now()}`;
    const env = { PLATESMITH_QUEUE: redis.url, PLATESMITH_QUEUE_PREFIX: prefix };
    const ws = await Promise.all(Array.from({ length: k }, () => workerProcess(env)));
    children.push(...ws);
    const api = await buildApp({ threads: 1, rateLimit: 0, queue: { url: redis.url, prefix } });
    await api.ready();
    rows[`queue${k}S`] = await run(api);
    await api.close();
    for (const w of ws) {
      const exited = new Promise((r) => w.once('exit', r));
      w.kill('SIGTERM');
      await exited;
    }
    say(`queue, ${k} worker process${k > 1 ? 'es' : ''} (1 thread each): ${marks} marks in ${round(rows[`queue${k}S`]!)} s, ${round(marks / rows[`queue${k}S`]!)} marks/s`);
  }
  const overheadMs = ((rows['queue1S']! - rows['embeddedS']!) / marks) * 1000;
  say(`queue overhead per mark (1 worker against embedded, same threads): ${round(overheadMs, 1)} ms`);
  if (json) {
    process.stdout.write(
      JSON.stringify({
        bench: 'queue',
        marks,
        ...machine,
        loadAverage: round(loadavg()[0]!, 1),
        embeddedMarksPerSecond: round(marks / rows['embeddedS']!),
        queue1MarksPerSecond: round(marks / rows['queue1S']!),
        queue2MarksPerSecond: round(marks / rows['queue2S']!),
        overheadMsPerMark: round(overheadMs, 1),
      }) + '\n',
    );
  }
} finally {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  await redis.stop();
}
