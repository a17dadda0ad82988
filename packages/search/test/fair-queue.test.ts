/**
 * The pool's queue takes flows in turns (issue 16: synchronous searches share the pool fairly with
 * schedule marks). The rule is the service's own (README, "Fair jobs": round-robin over keys, then
 * over each key's jobs or requests), the same as the FairGate's; no external source. The order
 * depends only on the calls, so each test states it exactly.
 */
import { Piscina, type TaskQueue } from 'piscina';
import { describe, expect, test } from 'vitest';
import { FairTaskQueue, inFlow } from '../src/fair-queue.js';

type Task = Parameters<TaskQueue['push']>[0];
const task = (name: string, owner?: string, flow?: string): Task & { name: string } =>
  (owner === undefined ? { name } : inFlow({ name }, { owner, flow: flow ?? '' })) as unknown as Task & { name: string };
const drain = (q: FairTaskQueue): string[] => {
  const out: string[] = [];
  for (let t = q.shift(); t; t = q.shift()) out.push((t as unknown as { name: string }).name);
  return out;
};

describe('FairTaskQueue', () => {
  test('a request queued behind a schedule job\'s tasks is served after the job\'s next task, not after all of them', () => {
    const q = new FairTaskQueue();
    for (const n of ['m1', 'm2', 'm3', 'm4']) q.push(task(n, '', 'job-1'));
    q.push(task('search', '', 'request:7'));
    expect(q.size).toBe(5);
    // first-in first-out would give m1 m2 m3 m4 search
    expect(drain(q)).toEqual(['m1', 'search', 'm2', 'm3', 'm4']);
    expect(q.size).toBe(0);
  });

  test('owners first, then each owner\'s flows: two keys alternate whatever their numbers of flows', () => {
    const q = new FairTaskQueue();
    q.push(task('a1', 'alice', 'job-1'));
    q.push(task('a2', 'alice', 'job-2'));
    q.push(task('a3', 'alice', 'job-1'));
    q.push(task('a4', 'alice', 'job-2'));
    q.push(task('b1', 'bob', 'request:1'));
    q.push(task('b2', 'bob', 'request:1'));
    expect(drain(q)).toEqual(['a1', 'b1', 'a2', 'b2', 'a3', 'a4']);
  });

  test('a task put back (piscina found no free worker) is the next one out, ahead of the ring', () => {
    const q = new FairTaskQueue();
    const m1 = task('m1', '', 'job-1');
    q.push(m1);
    q.push(task('m2', '', 'job-1'));
    q.push(task('s1', '', 'request:1'));
    expect(drain1(q)).toBe('m1');
    q.unshift(m1);
    expect(drain(q)).toEqual(['m1', 's1', 'm2']);
  });

  test('remove takes a waiting task out (an aborted request) and the rest keep their order', () => {
    const q = new FairTaskQueue();
    const s1 = task('s1', '', 'request:1');
    q.push(task('m1', '', 'job-1'));
    q.push(s1);
    q.push(task('m2', '', 'job-1'));
    q.push(task('u1'));
    q.remove(s1);
    q.remove(s1); // a second call (piscina may call it for a task no longer queued) changes nothing
    expect(q.size).toBe(3);
    // untagged tasks are a flow of owner '' of their own: they take turns with job-1
    expect(drain(q)).toEqual(['m1', 'u1', 'm2']);
  });

  test('the flow is a symbol-keyed property: the worker never receives it', () => {
    const msg = inFlow({ kind: 'ping' }, { owner: 'alice', flow: 'job-1' });
    expect(structuredClone(msg)).toEqual({ kind: 'ping' });
    expect((msg as Record<symbol, unknown>)[Piscina.queueOptionsSymbol]).toEqual({ owner: 'alice', flow: 'job-1' });
  });
});

function drain1(q: FairTaskQueue): string {
  return (q.shift() as unknown as { name: string }).name;
}
