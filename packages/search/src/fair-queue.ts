import { Piscina, type TaskQueue } from 'piscina';

/**
 * Who a pool task is for: an `owner` (an API key's id; '' without keys) and a `flow` within it
 * (one synchronous request, or one schedule job). Put on a task's message under
 * `Piscina.queueOptionsSymbol` (a symbol key: the structured clone to the worker drops it).
 */
export interface Flow {
  owner: string;
  flow: string;
}

type Task = Parameters<TaskQueue['push']>[0];

/** the flow of a task; untagged tasks share one flow of their own */
function flowOf(t: Task): Flow {
  const o = (t as unknown as Record<symbol, unknown>)[Piscina.queueOptionsSymbol] as Partial<Flow> | null | undefined;
  return { owner: typeof o?.owner === 'string' ? o.owner : '', flow: typeof o?.flow === 'string' ? o.flow : '' };
}

/**
 * The pool's queue, taken in turns: round-robin over owners, then over each owner's flows, each
 * flow first-in first-out. The same rule as the FairGate of schedule marks, one level down: a
 * synchronous search queued behind a schedule mark's slices gets the next free thread after the
 * mark's next task, not after every task the schedule has queued, and each of its steps (the
 * analysis, the slices, the explanations) takes its turn again when it is queued.
 *
 * Invariant: the owner (and the flow) served goes to the back of its ring; a newcomer joins at the
 * back; a task put back (`unshift`, piscina's retry of a task no worker took) goes to the front
 * of its flow and its flow and owner to the front of their rings. The order depends only on the
 * calls, so a test replays it exactly. Piscina owns the capacity check (maxQueue reads `size`).
 */
export class FairTaskQueue implements TaskQueue {
  /** owners in ring order, each with its flows in ring order, each flow's tasks in order */
  readonly #ring = new Map<string, Map<string, Task[]>>();
  #size = 0;

  get size(): number {
    return this.#size;
  }

  push(task: Task): void {
    const { owner, flow } = flowOf(task);
    let flows = this.#ring.get(owner);
    if (!flows) this.#ring.set(owner, (flows = new Map()));
    let q = flows.get(flow);
    if (!q) flows.set(flow, (q = []));
    q.push(task);
    this.#size++;
  }

  unshift(task: Task): void {
    const { owner, flow } = flowOf(task);
    const flows = this.#ring.get(owner) ?? new Map<string, Task[]>();
    const q = flows.get(flow) ?? [];
    q.unshift(task);
    // to the front of both rings (a Map keeps insertion order: rebuild with this entry first)
    flows.delete(flow);
    const f2 = new Map([[flow, q], ...flows]);
    this.#ring.delete(owner);
    const rest = [...this.#ring];
    this.#ring.clear();
    this.#ring.set(owner, f2);
    for (const [k, v] of rest) this.#ring.set(k, v);
    this.#size++;
  }

  shift(): Task | null {
    const first = this.#ring.entries().next();
    if (first.done) return null;
    const [owner, flows] = first.value;
    const [flow, q] = flows.entries().next().value as [string, Task[]];
    const task = q.shift()!;
    flows.delete(flow);
    if (q.length > 0) flows.set(flow, q);
    this.#ring.delete(owner);
    if (flows.size > 0) this.#ring.set(owner, flows);
    this.#size--;
    return task;
  }

  remove(task: Task): void {
    const { owner, flow } = flowOf(task);
    const flows = this.#ring.get(owner);
    const q = flows?.get(flow);
    const i = q ? q.indexOf(task) : -1;
    if (!flows || !q || i < 0) return;
    q.splice(i, 1);
    this.#size--;
    if (q.length === 0) flows.delete(flow);
    if (flows.size === 0) this.#ring.delete(owner);
  }
}

/** `msg` tagged with its flow for the FairTaskQueue (unchanged without one). */
export function inFlow<T extends object>(msg: T, flow: Flow | undefined): T {
  return flow ? Object.assign(msg, { [Piscina.queueOptionsSymbol]: { owner: flow.owner, flow: flow.flow } }) : msg;
}
