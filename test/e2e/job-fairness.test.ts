/**
 * Regression tests of issue 16's "no fairness and no job budget": one schedule estimated at 4.6 h
 * blocked every other client's jobs (one job at a time). Now marks take fair turns (round-robin
 * over keys, then over each key's jobs), each mark and each job has a time budget, and finished
 * jobs are removed after the retention. The searches here are stand-ins the test controls; the
 * order is decided by the calls alone (no clock, no sleeps). Behaviour tests; no engineering value.
 */
import type { MarkResult, ScheduleJson, ScheduleProgress } from '@platesmith/schedule';
import { expect, test } from 'vitest';
import { FairGate } from '../../services/api/src/jobs/fair.js';
import { JobManager, type Turn } from '../../services/api/src/jobs/manager.js';
import { MemoryJobStore, type JobRecord, type JobSummary } from '../../services/api/src/jobs/store.js';

const input = (prefix: string, marks: number): ScheduleJson => ({ defaults: {}, girders: Array.from({ length: marks }, (_, i) => ({ mark: `${prefix}${i + 1}`, quantity: 1 })) }) as unknown as ScheduleJson;
const markOf = (m: string): MarkResult => ({ mark: m, quantity: 1, status: 'ok', search: null, adopted: null });
const totals = (k: number) => ({ marks: k, marksFailed: 0, girders: k, tonnage: 0, marksWithoutFeasible: [], girdersWithoutFeasible: 0, adoptedFailing: [] });

/** Like runSchedule: one turn per mark, in order, the mark's search inside the turn. */
function workWith(search: (mark: string, signal: AbortSignal) => Promise<void>) {
  return async (inp: ScheduleJson, signal: AbortSignal, onProgress: (p: ScheduleProgress) => void, turn: Turn) => {
    const marks: MarkResult[] = [];
    for (const g of inp.girders) {
      if (signal.aborted) throw signal.reason;
      try {
        await turn((s) => search(g.mark, s));
        marks.push(markOf(g.mark));
      } catch (e) {
        if (signal.aborted) throw signal.reason;
        const err = e as { code?: string; message?: string };
        marks.push({ ...markOf(g.mark), status: 'failed', error: { code: err.code ?? 'SEARCH_FAILED', message: String(err.message) } });
      }
      onProgress({ marksDone: marks.length, marksTotal: inp.girders.length, currentMark: null, elapsedMs: 0, estimateMs: 0, finished: marks.at(-1)! });
    }
    return { name: null, marks, totals: totals(marks.length) };
  };
}

function finished(m: JobManager, id: string): Promise<JobSummary> {
  return new Promise((resolve) => {
    const unsub = m.subscribe(id, (e) => {
      if (e.type === 'done') {
        unsub();
        resolve(e.job);
      }
    });
  });
}

test('the gate: two keys\' marks alternate, and one key\'s jobs alternate among themselves', async () => {
  const gate = new FairGate(1);
  const order: string[] = [];
  const turns: Promise<void>[] = [];
  const take = (owner: string, job: string, mark: string) =>
    turns.push(
      gate.acquire(owner, job, undefined).then((release) => {
        order.push(mark);
        release();
      }),
    );
  // while one turn is held, key A queues six marks of one job and two of another, key B two marks
  const hold = await gate.acquire('x', 'x', undefined);
  for (let i = 1; i <= 6; i++) take('A', 'a1', `a1.${i}`);
  take('A', 'a2', 'a2.1');
  take('A', 'a2', 'a2.2');
  take('B', 'b1', 'b1.1');
  take('B', 'b1', 'b1.2');
  expect(gate.waiting).toBe(10);
  hold();
  await Promise.all(turns);
  expect(order).toEqual(['a1.1', 'b1.1', 'a2.1', 'b1.2', 'a1.2', 'a2.2', 'a1.3', 'a1.4', 'a1.5', 'a1.6']);
});

test('the fairness order of two keys\' marks: a 4-mark schedule of key B is not held behind a 12-mark one of key A', async () => {
  // each search waits until the test lets it finish, and the test lets one finish only once the
  // other job's next mark is waiting (or that job has no mark left): the order is then fixed
  const running: { mark: string; finish: () => void }[] = [];
  let changed: () => void = () => {};
  const m = new JobManager(new MemoryJobStore(), workWith((mark) => new Promise<void>((finish) => {
    running.push({ mark, finish });
    changed();
  })), { retentionMs: 0 });
  const unwatch = m.gate.watch(() => changed());
  const until = (ok: () => boolean): Promise<void> => new Promise((resolve) => {
    if (ok()) return resolve();
    changed = () => {
      if (ok()) {
        changed = () => {};
        resolve();
      }
    };
  });
  const a = await m.submit(input('A', 12), 'key-a');
  await until(() => running.length === 1);
  const b = await m.submit(input('B', 4), 'key-b');
  const bDone = finished(m, b.id);
  const aDone = finished(m, a.id);
  const order: string[] = [];
  let bLeft = 4;
  let aLeft = 12;
  while (aLeft + bLeft > 0) {
    // wait for the other job's waiting turn (when it has marks left), then finish the running mark
    await until(() => running.length === 1 && m.gate.waiting === (aLeft > 0 && bLeft > 0 ? 1 : 0));
    const r = running.shift()!;
    order.push(r.mark);
    if (r.mark.startsWith('A')) aLeft--;
    else bLeft--;
    r.finish();
    if (aLeft + bLeft > 0) await until(() => running.length === 1);
  }
  expect(order).toEqual(['A1', 'B1', 'A2', 'B2', 'A3', 'B3', 'A4', 'B4', 'A5', 'A6', 'A7', 'A8', 'A9', 'A10', 'A11', 'A12']);
  expect((await bDone).status).toBe('done');
  expect((await aDone).status).toBe('done');
  unwatch();
  await m.shutdown();
});

test('without keys, different jobs take turns the same way', async () => {
  const order: string[] = [];
  const m = new JobManager(new MemoryJobStore(), workWith(async (mark) => void order.push(mark)), { retentionMs: 0, slots: 1 });
  // both jobs admitted before either runs a mark: the gate decides alone
  const hold = await m.gate.acquire('test', 'hold');
  const a = await m.submit(input('A', 5));
  const b = await m.submit(input('B', 2));
  const done = Promise.all([finished(m, a.id), finished(m, b.id)]);
  await new Promise<void>((resolve) => {
    const stop = m.gate.watch(() => {
      if (m.gate.waiting === 2) {
        stop();
        resolve();
      }
    });
    if (m.gate.waiting === 2) resolve();
  });
  hold();
  await done;
  expect(order.slice(0, 4)).toEqual(['A1', 'B1', 'A2', 'B2']);
  expect(order).toHaveLength(7);
  await m.shutdown();
});

test('a mark past its time budget fails alone (MARK_BUDGET_EXCEEDED); a job past its budget fails and keeps its finished marks', async () => {
  // a stand-in search that only ends when its signal aborts, for the marks named SLOW
  const search = (mark: string, signal: AbortSignal) =>
    mark.includes('SLOW') ? new Promise<void>((_, reject) => signal.addEventListener('abort', () => reject(signal.reason), { once: true })) : Promise.resolve();
  const store = new MemoryJobStore();
  const m = new JobManager(store, workWith(search), { retentionMs: 0, markBudgetMs: 50, jobBudgetMs: 60_000 });
  const job = await m.submit({ defaults: {}, girders: [{ mark: 'G1', quantity: 1 }, { mark: 'SLOW2', quantity: 1 }, { mark: 'G3', quantity: 1 }] } as unknown as ScheduleJson);
  const s = await finished(m, job.id);
  expect(s.status).toBe('done');
  const r = await store.result(job.id);
  expect(r!.marks.map((x) => [x.mark, x.status, x.error?.code])).toEqual([['G1', 'ok', undefined], ['SLOW2', 'failed', 'MARK_BUDGET_EXCEEDED'], ['G3', 'ok', undefined]]);
  await m.shutdown();

  const m2 = new JobManager(store, workWith(search), { retentionMs: 0, markBudgetMs: 60_000, jobBudgetMs: 50 });
  const j2 = await m2.submit({ defaults: {}, girders: [{ mark: 'G1', quantity: 1 }, { mark: 'SLOW2', quantity: 1 }, { mark: 'G3', quantity: 1 }] } as unknown as ScheduleJson);
  const s2 = await finished(m2, j2.id);
  expect(s2).toMatchObject({ status: 'failed', error: { code: 'JOB_BUDGET_EXCEEDED' } });
  expect((await store.marks(j2.id)).map((x) => x.mark.mark)).toEqual(['G1']);
  await m2.shutdown();
});

test('retention: finished jobs older than the retention are removed with their marks; newer and unfinished ones stay', async () => {
  const store = new MemoryJobStore();
  const day = 86_400_000;
  let now = Date.parse('2026-03-10T12:00:00.000Z');
  const rec = (id: string, status: JobRecord['status'], finishedAt: string | null): JobRecord => ({ id, kind: 'schedule', owner: null, status, name: null, marks: 1, createdAt: '2026-03-01T00:00:00.000Z', startedAt: null, finishedAt, progress: null, input: input('G', 1), result: null, error: null, resumed: 0 });
  await store.insert(rec('old-done', 'done', '2026-03-02T12:00:00.000Z'));
  await store.insert(rec('old-failed', 'failed', '2026-03-03T11:59:59.000Z'));
  await store.insert(rec('recent', 'done', '2026-03-03T12:00:01.000Z'));
  await store.insert(rec('waiting', 'queued', null));
  await store.putMark('old-done', 0, markOf('G1'));
  const m = new JobManager(store, workWith(async () => {}), { resume: false, retentionMs: 7 * day, now: () => now });
  expect(await m.sweep()).toBe(2);
  expect((await store.list({ limit: 10 })).map((j) => j.id).sort()).toEqual(['recent', 'waiting']);
  expect(await store.marks('old-done')).toEqual([]);
  now += 2 * day;
  expect(await m.sweep()).toBe(1);
  expect((await store.list({ limit: 10 })).map((j) => j.id)).toEqual(['waiting']);
  await m.shutdown();
});

test('synchronous searches waited on the shared pool behind a schedule\'s marks: now a request\'s task is the next one out after the mark\'s next task', async () => {
  // the real pool (one thread) with the fixture worker: each task a gate the test opens, so the
  // order in which the thread takes them is read exactly (no clock). A schedule job's flow has
  // one task running and three queued (a mark's slices and explanations); then a synchronous
  // search's first task arrives. First-in first-out ran the request after all three; the pool's
  // queue now takes flows in turns (the README's "Fair jobs" rule, one level down).
  const { createEngine } = await import('../../services/app/src/engine.js');
  const { FIXTURE_WORKER, gate } = await import('../../services/app/test/fixtures/worker.js');
  const engine = createEngine({ threads: 1, maxActive: 16, workerFile: FIXTURE_WORKER });
  try {
    await engine.ping();
    const job = { owner: '', flow: 'job-1' };
    const request = { owner: '', flow: 'request:1' };
    const named = [
      ['m0', job],
      ['m1', job],
      ['m2', job],
      ['m3', job],
      ['search', request],
    ] as const;
    const gates = new Map<string, ReturnType<typeof gate>>(named.map(([n]) => [n, gate()]));
    const started: string[] = [];
    let wake: () => void = () => {};
    for (const [n] of named) void gates.get(n)!.entered.then(() => {
      started.push(n);
      wake();
    });
    const startedCount = (k: number): Promise<void> => new Promise((resolve) => {
      wake = () => started.length >= k && resolve();
      wake();
    });
    const runs: Promise<unknown>[] = [];
    // m0 takes the thread; the rest queue in this order
    runs.push(engine.run({ kind: 'gate', gate: gates.get('m0')!.buffer }, { flow: job }));
    await gates.get('m0')!.entered;
    for (const [n, flow] of named.slice(1)) runs.push(engine.run({ kind: 'gate', gate: gates.get(n)!.buffer }, { flow }));
    // open each task as it starts: the thread then takes the next one the queue gives
    for (let i = 0; i < named.length; i++) {
      await startedCount(i + 1);
      gates.get(started[i]!)!.open();
    }
    await Promise.all(runs);
    expect(started).toEqual(['m0', 'm1', 'search', 'm2', 'm3']);
  } finally {
    await engine.close();
  }
});
