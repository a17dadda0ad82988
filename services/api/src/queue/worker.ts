import { DomainError } from '@platesmith/catalogue';
import type { Engine } from '@platesmith/app';
import { runSchedule, type MarkResult, type ScheduleJson } from '@platesmith/schedule';
import { DEFAULT_SPACE_CAP } from '@platesmith/schema';
import { Worker, WaitingError, type Job } from 'bullmq';
import { Redis } from 'ioredis';
import { FairGate } from '../jobs/fair.js';
import { JOB_DEFAULTS } from '../jobs/manager.js';
import { TERMINAL } from '../jobs/store.js';
import { EventPublisher } from './events.js';
import { channels, closeWithin, DEFAULT_PREFIX, FINISH_QUEUE, redisOptions, type QueueConfig } from './names.js';
import { RedisJobStore } from './redis-store.js';

/** A mark child of a schedule's flow. */
export interface MarkData {
  id: string;
  index: number;
  mark: string;
  owner: string | null;
}

export interface QueueWorkerOptions extends QueueConfig {
  /** this process's engine (its own worker-thread pool) */
  engine: Engine;
  spaceCap?: number;
  /** a mark's and a job's search time budgets, ms (PLATESMITH_MARK_BUDGET, PLATESMITH_JOB_BUDGET) */
  markBudgetMs?: number;
  jobBudgetMs?: number;
  /**
   * BullMQ's lock on a mark a worker holds, ms (default 30 000): renewed every half of it while
   * the worker lives; a worker killed holding it leaves the mark to the stalled check of another
   * worker (every `stalledIntervalMs`, default 30 000) once the lock has expired. Tests shorten both.
   */
  lockDurationMs?: number;
  stalledIntervalMs?: number;
  /** how often a mark may be left stalled before it fails (default 5) */
  maxStalledCount?: number;
  /** the log (pino-like) */
  log?: { info(o: object, m: string): void; warn(o: object, m: string): void; error(o: object, m: string): void };
}

const SHUTDOWN = Symbol('shutdown');
const INPUT_CACHE = 32;

/**
 * A worker process of the queue backend (`platesmith worker`): takes marks from every key's
 * queue and the finishing of schedules from the finish queue, with this process's own engine.
 *
 * Fairness between keys: one BullMQ Worker per key's queue (concurrency 1), all of this process's
 * marks taking turns on one FairGate (one search at a time: a search uses every thread), which
 * hands turns round-robin over the keys. Within a key's queue, a mark's BullMQ priority is its
 * index in its schedule, so the key's jobs interleave mark by mark (a new 4-mark job does not wait
 * for the end of a 500-mark one of the same key). New keys' queues are announced on a channel.
 *
 * At-least-once: a mark is stored with HSETNX (once); a worker that dies after storing it and
 * before BullMQ records it done leaves it to be run again, and the second result is not stored.
 * Graceful close: stops taking marks, lets the one running finish within `graceMs`, else stops
 * its search and puts it back in its queue for another worker.
 */
export class QueueWorker {
  readonly store: RedisJobStore;
  readonly #o: Required<Omit<QueueWorkerOptions, 'log' | 'engine' | 'prefix'>> & { prefix: string; engine: Engine };
  readonly #log: NonNullable<QueueWorkerOptions['log']>;
  readonly #gate = new FairGate(1);
  readonly #workers = new Map<string, Worker<MarkData>>();
  #finish: Worker | undefined;
  #events: EventPublisher;
  #sub: Redis | undefined;
  #ownerTimer: NodeJS.Timeout | undefined;
  readonly #running = new Map<string, Set<AbortController>>();
  readonly #inputs = new Map<string, ScheduleJson>();
  #closing = false;
  #closed: Promise<void> | undefined;
  /** marks this process computed, and of those the ones whose result was already stored (computed twice) */
  readonly counts = { computed: 0, stored: 0, duplicates: 0, skipped: 0 };

  constructor(opts: QueueWorkerOptions) {
    const prefix = opts.prefix ?? DEFAULT_PREFIX;
    this.#o = {
      url: opts.url,
      prefix,
      engine: opts.engine,
      spaceCap: opts.spaceCap ?? DEFAULT_SPACE_CAP,
      markBudgetMs: opts.markBudgetMs ?? JOB_DEFAULTS.markBudgetMs,
      jobBudgetMs: opts.jobBudgetMs ?? JOB_DEFAULTS.jobBudgetMs,
      lockDurationMs: opts.lockDurationMs ?? 30_000,
      stalledIntervalMs: opts.stalledIntervalMs ?? 30_000,
      maxStalledCount: opts.maxStalledCount ?? 5,
    };
    const quiet = () => {};
    this.#log = opts.log ?? { info: quiet, warn: quiet, error: quiet };
    this.store = new RedisJobStore({ url: opts.url, prefix });
    this.#events = new EventPublisher({ url: opts.url, prefix }, this.store);
  }

  #workerOpts() {
    return {
      connection: redisOptions(this.#o.url, { maxRetriesPerRequest: null }),
      prefix: this.#o.prefix,
      concurrency: 1,
      lockDuration: this.#o.lockDurationMs,
      stalledInterval: this.#o.stalledIntervalMs,
      maxStalledCount: this.#o.maxStalledCount,
      // an idle worker asks again every second: a schedule's marks arrive at once, and BullMQ's
      // marker wakes one blocked worker; the others would wait out the default 5 s
      drainDelay: 1,
    };
  }

  /** Connects, starts the finish worker and one worker per key's queue known now; new keys' queues as they are announced. */
  async start(): Promise<void> {
    await this.store.connected();
    const ch = channels(this.#o.prefix);
    this.#finish = new Worker(FINISH_QUEUE, (job) => this.#finishJob(job), this.#workerOpts());
    this.#finish.on('error', (err) => this.#log.warn({ err }, 'finish worker: queue error'));
    this.#sub = new Redis(redisOptions(this.#o.url, { maxRetriesPerRequest: null }));
    this.#sub.on('error', () => {});
    this.#sub.on('message', (channel: string, msg: string) => {
      if (channel === ch.owners) this.#consume(msg);
      else if (channel === ch.cancel) this.#stop(msg);
    });
    await this.#sub.subscribe(ch.owners, ch.cancel);
    const known = async () => {
      for (const q of await this.store.redis.smembers(ch.ownerSet).catch(() => [] as string[])) this.#consume(q);
    };
    await known();
    // a worker that missed an announcement (Redis was down) still finds the queue
    this.#ownerTimer = setInterval(() => void known(), 5000);
    this.#ownerTimer.unref();
    await this.#finish.waitUntilReady();
    this.#log.info({ queues: this.#workers.size + 1 }, 'queue worker started');
  }

  #consume(queue: string): void {
    if (this.#closing || this.#workers.has(queue) || !/^marks-[a-z0-9]{1,32}$/.test(queue)) return;
    const w = new Worker<MarkData>(queue, (job, token, signal) => this.#markJob(job, token, signal), this.#workerOpts());
    w.on('error', (err) => this.#log.warn({ err, queue }, 'mark worker: queue error'));
    this.#workers.set(queue, w);
  }

  /** aborts the running and waiting marks of schedule `id` in this process */
  #stop(id: string): void {
    for (const ac of this.#running.get(id) ?? []) ac.abort(new DOMException('the schedule was cancelled', 'AbortError'));
  }

  async #input(id: string): Promise<ScheduleJson | undefined> {
    const hit = this.#inputs.get(id);
    if (hit) return hit;
    const input = await this.store.input(id);
    if (!input) return undefined;
    if (this.#inputs.size >= INPUT_CACHE) this.#inputs.delete(this.#inputs.keys().next().value!);
    this.#inputs.set(id, input);
    return input;
  }

  async #failJob(id: string, code: string, message: string): Promise<void> {
    const r = await this.store.updateIfActive(id, { status: 'failed', error: { code, message }, finishedAt: new Date().toISOString() });
    if (r === 'applied') {
      await this.store.redis.publish(channels(this.#o.prefix).cancel, id);
      await this.#events.publish(id, 'done');
    }
  }

  async #markJob(job: Job<MarkData>, token: string | undefined, bullSignal: AbortSignal | undefined): Promise<{ stored: boolean } | { skipped: true }> {
    const { id, index, mark, owner } = job.data;
    const ac = new AbortController();
    if (bullSignal) bullSignal.addEventListener('abort', () => ac.abort(bullSignal.reason), { once: true });
    let set = this.#running.get(id);
    if (!set) this.#running.set(id, (set = new Set()));
    set.add(ac);
    let release: (() => void) | undefined;
    try {
      // one search at a time in this process, the keys' marks in turn
      release = await this.#gate.acquire(owner ?? '', id, ac.signal);
      const resumed = job.attemptsStarted > 1 || (job.stalledCounter ?? 0) > 0;
      const status = await this.store.begin(id, mark, resumed);
      if (status === undefined || TERMINAL.has(status)) {
        this.counts.skipped++;
        return { skipped: true };
      }
      const input = await this.#input(id);
      const g = input?.girders[index];
      if (!input || !g || g.mark !== mark) {
        this.counts.skipped++;
        return { skipped: true };
      }
      this.#log.info({ jobId: id, mark, index, owner, attempt: job.attemptsStarted }, 'mark taken');
      void this.#events.publish(id, 'progress').catch(() => {});
      const spent = await this.store.spend(id, 0);
      const left = this.#o.jobBudgetMs - spent;
      if (left <= 0) {
        await this.#failJob(id, 'JOB_BUDGET_EXCEEDED', this.#budgetMessage(await this.store.markCount(id), input.girders.length));
        return { skipped: true };
      }
      const byJob = left < this.#o.markBudgetMs;
      const timer = AbortSignal.timeout(Math.max(1, Math.ceil(byJob ? left : this.#o.markBudgetMs)));
      let jobOver = false;
      const t0 = performance.now();
      let m: MarkResult;
      try {
        const r = await runSchedule(
          { name: input.name, defaults: input.defaults, girders: [g] } as ScheduleJson,
          {
            spaceCap: this.#o.spaceCap,
            search: (task) =>
              this.#o.engine.searchTask(task, AbortSignal.any([ac.signal, timer])).catch((e: unknown) => {
                if (!timer.aborted || ac.signal.aborted) throw e;
                if (byJob) {
                  jobOver = true;
                  throw e;
                }
                throw new DomainError(
                  'MARK_BUDGET_EXCEEDED',
                  `the search of this mark ran past its time budget of ${this.#o.markBudgetMs} ms and was stopped`,
                  'narrow the mark\'s space (fewer web depths, plates or panel counts), or ask the operator to raise PLATESMITH_MARK_BUDGET',
                  'space',
                );
              }),
          },
          ac.signal,
        );
        m = r.marks[0]!;
      } finally {
        await this.store.spend(id, performance.now() - t0).catch(() => 0);
      }
      if (jobOver) {
        await this.#failJob(id, 'JOB_BUDGET_EXCEEDED', this.#budgetMessage(await this.store.markCount(id), input.girders.length));
        return { skipped: true };
      }
      this.counts.computed++;
      const stored = await this.store.putMarkOnce(id, index, m);
      if (stored) this.counts.stored++;
      else this.counts.duplicates++;
      await this.#events.publish(id, 'progress').catch(() => {});
      return { stored };
    } catch (e) {
      if (ac.signal.aborted && ac.signal.reason === SHUTDOWN && token) {
        // a graceful stop past its grace: the mark goes back to its queue for another worker
        await job.moveToWait(token);
        throw new WaitingError();
      }
      if (ac.signal.aborted) {
        this.counts.skipped++;
        return { skipped: true };
      }
      throw e;
    } finally {
      release?.();
      set.delete(ac);
      if (set.size === 0) this.#running.delete(id);
    }
  }

  #budgetMessage(done: number, total: number): string {
    return `the schedule's searches ran past the job's time budget of ${this.#o.jobBudgetMs} ms; ${done} of ${total} marks finished (GET its marks); split the schedule or narrow its spaces`;
  }

  /** The parent of a schedule's flow: once its marks are done, the schedule is finished (tonnage, rationalisation, comparison) and stored. */
  async #finishJob(job: Job): Promise<{ finished: boolean }> {
    const id = String(job.id);
    const s = await this.store.get(id);
    if (!s || TERMINAL.has(s.status)) return { finished: false };
    const input = await this.store.input(id);
    if (!input) return { finished: false };
    const stored = await this.store.marks(id);
    const byIndex = new Map(stored.map((m) => [m.index, m.mark]));
    const marks = input.girders.map((g, i) => (byIndex.get(i)?.mark === g.mark ? byIndex.get(i) : undefined));
    const missing = input.girders.filter((_, i) => marks[i] === undefined).map((g) => g.mark);
    if (missing.length > 0) {
      this.#log.error({ jobId: id, missing }, 'schedule finished with marks that failed in the queue');
      await this.#failJob(id, 'INTERNAL', `marks ${missing.slice(0, 10).join(', ')}${missing.length > 10 ? ', …' : ''} failed in the queue after their retries; the schedule run failed unexpectedly (logged under the job id)`);
      return { finished: false };
    }
    // on this process's pool (records, tonnage, the rationalisation's solves): the event loop keeps renewing BullMQ's locks
    const result = await this.#o.engine.finish(input, marks as MarkResult[]);
    const n = input.girders.length;
    const r = await this.store.updateIfActive(id, {
      status: 'done',
      result,
      finishedAt: new Date().toISOString(),
      progress: { ...(s.progress ?? { elapsedMs: 0, estimateMs: 0 }), marksDone: n, marksTotal: n, currentMark: null, estimateMs: 0 },
    });
    if (r === 'applied') await this.#events.publish(id, 'done');
    this.#inputs.delete(id);
    return { finished: r === 'applied' };
  }

  /**
   * Stops taking marks; the running one may finish within `graceMs` (default 8 s), else its search
   * stops and it goes back to its queue. Then closes the connections.
   */
  close(graceMs = 8000): Promise<void> {
    return (this.#closed ??= this.#close(graceMs));
  }

  async #close(graceMs: number): Promise<void> {
    this.#closing = true;
    if (this.#ownerTimer) clearInterval(this.#ownerTimer);
    const workers = [...this.#workers.values(), ...(this.#finish ? [this.#finish] : [])];
    const timer = setTimeout(() => {
      for (const set of this.#running.values()) for (const ac of set) ac.abort(SHUTDOWN);
    }, graceMs);
    try {
      // each waits for its running mark (up to the grace), then for Redis at most a few seconds more
      await Promise.all(workers.map((w) => closeWithin(w, graceMs + 5000)));
    } finally {
      clearTimeout(timer);
    }
    await this.#sub?.quit().catch(() => {});
    await this.#events.close().catch(() => {});
    await this.store.close();
  }
}
