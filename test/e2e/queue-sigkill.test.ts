/**
 * The queue backend with two worker processes (`platesmith worker`, as the README runs them), one
 * SIGKILLed in the middle of a mark: the mark is taken up by the other worker once its lock has
 * expired (BullMQ's stalled-job check; the test shortens the lock to 2 s and the check to 1 s
 * through PLATESMITH_QUEUE_LOCK_MS and PLATESMITH_QUEUE_STALLED_MS), the schedule completes,
 * every mark is stored once (none lost, none twice), and the result equals the embedded
 * backend's for the same schedule, timing fields aside.
 *
 * Behaviour test of the queue; no engineering value is asserted (the embedded run is the
 * reference). Redis on a free loopback port (or CI's); every wait is bounded; the test kills the
 * processes it started.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, expect, test } from 'vitest';
import { start } from '../../services/api/test/harness.js';
import { HAVE_REDIS, NO_REDIS, sharedRedis, testPrefix, type RedisServer } from '../helpers/redis.js';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const children = new Set<ChildProcess>();
let redis: RedisServer | undefined;
afterAll(async () => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  await redis?.stop();
});

const ACTIONS = [
  { kind: 'permanent', load: 'udl', value: 10 },
  { kind: 'variable', load: 'udl', value: 15, category: 'B' },
];
// invented test scenario: eight marks whose searches take about a second or more each on one thread
const SCHEDULE = {
  name: 'sigkill',
  defaults: { actions: ACTIONS, options: { restraint: 'continuous' }, space: { webDepth: { min: 600, max: 2000, step: 50 }, panels: [0] } },
  tender: { rationalise: 2 },
  girders: Array.from({ length: 8 }, (_, i) => ({ mark: `K${i + 1}`, quantity: 1 + (i % 3), spans: [14000 + 1500 * i] })),
};

/** a worker process: `platesmith worker` from the source, its log lines (pino JSON on stderr) collected */
function worker(env: Record<string, string>): { child: ChildProcess; lines: Record<string, unknown>[]; taken: (n: number) => Promise<void> } {
  const child = spawn(process.execPath, ['--conditions=@platesmith/source', '--import', 'tsx', 'services/cli/src/main.ts', 'worker'], {
    cwd: root,
    env: { ...process.env, ...env, PLATESMITH_THREADS: '1', LOG_LEVEL: 'info' },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  children.add(child);
  const lines: Record<string, unknown>[] = [];
  const waiters: { n: number; resolve: () => void }[] = [];
  let buf = '';
  child.stderr!.on('data', (d: Buffer) => {
    buf += String(d);
    let i;
    while ((i = buf.indexOf('\n')) >= 0) {
      const line = buf.slice(0, i);
      buf = buf.slice(i + 1);
      try {
        lines.push(JSON.parse(line));
      } catch {
        lines.push({ msg: line });
      }
    }
    const n = lines.filter((l) => l['msg'] === 'mark taken').length;
    for (const w of waiters.filter((x) => n >= x.n)) {
      waiters.splice(waiters.indexOf(w), 1);
      w.resolve();
    }
  });
  const taken = (n: number) =>
    new Promise<void>((resolve, reject) => {
      const t = setTimeout(() => reject(new Error(`worker took fewer than ${n} marks in 60 s: ${JSON.stringify(lines.slice(-5))}`)), 60_000);
      waiters.push({ n, resolve: () => (clearTimeout(t), resolve()) });
    });
  return { child, lines, taken };
}

/** everything of a result but its timings */
function untimed(v: unknown): unknown {
  if (Array.isArray(v)) return v.map(untimed);
  if (v && typeof v === 'object') return Object.fromEntries(Object.entries(v).filter(([k]) => !/(Ms|Seconds|seconds|At)$/.test(k)).map(([k, x]) => [k, untimed(x)]));
  return v;
}

async function until(get: () => Promise<any>, ok: (b: any) => boolean, what: string, ms = 120_000): Promise<any> {
  const t0 = Date.now();
  for (;;) {
    const b = await get();
    if (ok(b)) return b;
    if (Date.now() - t0 > ms) throw new Error(`${what}: not reached in ${ms} ms: ${JSON.stringify(b).slice(0, 300)}`);
    await new Promise((r) => setTimeout(r, 100));
  }
}

test.skipIf(!HAVE_REDIS)((HAVE_REDIS ? '' : `${NO_REDIS}: `) + 'two worker processes, one SIGKILLed mid-mark: the schedule completes, every mark stored once, the result equals the embedded run', async () => {
  redis = await sharedRedis();
  const prefix = testPrefix();
  const env = { PLATESMITH_QUEUE: redis.url, PLATESMITH_QUEUE_PREFIX: prefix, PLATESMITH_QUEUE_LOCK_MS: '2000', PLATESMITH_QUEUE_STALLED_MS: '1000' };
  const w1 = worker(env);
  const w2 = worker(env);
  const api = await start({ threads: 1, queue: { url: redis.url, prefix } });
  try {
    const sub = await api.post('/v1/schedules', SCHEDULE);
    expect(sub.status).toBe(202);
    const id = sub.body.id as string;
    // the killed worker has just taken a mark: it is in the middle of it
    await w1.taken(1).catch((e) => { throw new Error(e.message + "\nW2: " + JSON.stringify(w2.lines.slice(-8))); });
    w1.child.kill('SIGKILL');
    const done = await until(async () => (await api.get(`/v1/schedules/${id}`)).body, (b) => ['done', 'failed', 'cancelled'].includes(b.status), 'the schedule finishing');
    expect(done).toMatchObject({ status: 'done', progress: { marksDone: 8, marksTotal: 8 } });
    // the killed worker's mark was taken up again by the other one (a second attempt of it)
    const killedMark = w1.lines.filter((l) => l['msg'] === 'mark taken').at(-1)!['mark'];
    expect(w2.lines.some((l) => l['msg'] === 'mark taken' && l['mark'] === killedMark && Number(l['attempt']) >= 2)).toBe(true);
    expect(done.resumed).toBeGreaterThanOrEqual(1);
    // none lost, none twice: each mark once, in schedule order
    const marks = (await api.get(`/v1/schedules/${id}/marks`)).body.marks.map((m: { mark: string }) => m.mark);
    expect(marks).toEqual(SCHEDULE.girders.map((g) => g.mark));
    const queued = (await api.get(`/v1/schedules/${id}/result`)).body;

    // the reference: the same schedule on the embedded backend, on one thread as each worker (the
    // search's work counts depend on the threads, never its answer)
    const emb = await start({ threads: 1 });
    try {
      const e = await emb.post('/v1/schedules', SCHEDULE);
      await until(async () => (await emb.get(`/v1/schedules/${e.body.id}`)).body, (b) => b.status === 'done', 'the embedded run');
      const reference = (await emb.get(`/v1/schedules/${e.body.id}/result`)).body;
      expect(untimed(queued)).toEqual(untimed(reference));
    } finally {
      await emb.close();
    }
  } finally {
    await api.close();
    w2.child.kill('SIGTERM');
    await new Promise((r) => (w2.child.exitCode !== null ? r(null) : w2.child.once('exit', r)));
  }
}, 240_000);
