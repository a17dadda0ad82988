/**
 * Fair turns on the search pool for the marks of schedule jobs: round-robin over owners (API
 * keys), and within an owner round-robin over its jobs. Each turn is one mark's search, which
 * already uses every worker, so `slots` is 1 by default.
 *
 * Invariant: an owner (or a job) that has just been served goes to the back of the ring; a
 * newcomer joins at the back. So with two owners waiting, their marks alternate whatever the
 * sizes of their schedules: a 4-mark schedule waits at most 4 marks of a 500-mark one. The order
 * depends only on the order of the calls (no clock), which a test can replay exactly.
 *
 * A queue backend keeps the same rule with one queue per owner consumed in turn.
 */
export class FairGate {
  readonly #slots: number;
  #busy = 0;
  /** owners with a waiting turn, in ring order; each with its jobs in ring order, each job's waiters first-in first-out */
  readonly #ring = new Map<string, Map<string, Waiter[]>>();
  readonly #watchers = new Set<() => void>();

  /** `slots` 0 gives no turns: jobs stay queued (a held queue, e.g. for maintenance or a test of queued jobs) */
  constructor(slots = 1) {
    this.#slots = Math.max(0, Math.floor(slots));
  }

  /** turns waiting */
  get waiting(): number {
    let n = 0;
    for (const jobs of this.#ring.values()) for (const w of jobs.values()) n += w.length;
    return n;
  }

  /** turns being run */
  get running(): number {
    return this.#busy;
  }

  /**
   * Resolves with a release function when it is this job's turn; rejects with the signal's reason
   * (and gives up its place) when `signal` aborts first. Call the release exactly once.
   */
  acquire(owner: string, job: string, signal?: AbortSignal): Promise<() => void> {
    if (signal?.aborted) return Promise.reject(signal.reason);
    return new Promise((resolve, reject) => {
      const w: Waiter = { grant: resolve, owner, job, onAbort: () => {} };
      if (signal) {
        w.onAbort = () => {
          this.#remove(w);
          reject(signal.reason);
        };
        signal.addEventListener('abort', w.onAbort, { once: true });
        w.signal = signal;
      }
      let jobs = this.#ring.get(owner);
      if (!jobs) this.#ring.set(owner, (jobs = new Map()));
      let q = jobs.get(job);
      if (!q) jobs.set(job, (q = []));
      q.push(w);
      this.#dispatch();
      this.#notify();
    });
  }

  /** Calls `fn` on every change of the waiting or running turns (tests synchronise on it) until the returned function is called. */
  watch(fn: () => void): () => void {
    this.#watchers.add(fn);
    return () => this.#watchers.delete(fn);
  }

  #notify(): void {
    for (const fn of this.#watchers) fn();
  }

  #remove(w: Waiter): void {
    const jobs = this.#ring.get(w.owner);
    const q = jobs?.get(w.job);
    if (!jobs || !q) return;
    const i = q.indexOf(w);
    if (i >= 0) q.splice(i, 1);
    if (q.length === 0) jobs.delete(w.job);
    if (jobs.size === 0) this.#ring.delete(w.owner);
    this.#notify();
  }

  #dispatch(): void {
    while (this.#busy < this.#slots) {
      // the first owner of the ring, its first job, that job's first waiter
      const first = this.#ring.entries().next();
      if (first.done) return;
      const [owner, jobs] = first.value;
      const [job, q] = jobs.entries().next().value as [string, Waiter[]];
      const w = q.shift()!;
      // the served job and owner go to the back of their rings (Map keeps insertion order)
      jobs.delete(job);
      if (q.length > 0) jobs.set(job, q);
      this.#ring.delete(owner);
      if (jobs.size > 0) this.#ring.set(owner, jobs);
      if (w.signal) w.signal.removeEventListener('abort', w.onAbort);
      this.#busy++;
      let released = false;
      w.grant(() => {
        if (released) return;
        released = true;
        this.#busy--;
        this.#dispatch();
        this.#notify();
      });
    }
  }
}

interface Waiter {
  grant: (release: () => void) => void;
  owner: string;
  job: string;
  onAbort: () => void;
  signal?: AbortSignal;
}
