import type { ScheduleJson } from '@platesmith/schedule';
import { FlowProducer, Queue } from 'bullmq';
import { ApiError } from '../errors.js';
import type { JobEvent, Jobs } from '../jobs/jobs.js';
import { JOB_DEFAULTS } from '../jobs/manager.js';
import { newScheduleJob, type JobSummary } from '../jobs/store.js';
import { EventListener, EventPublisher } from './events.js';
import type { Redis } from 'ioredis';
import { channels, client, closeWithin, DEFAULT_PREFIX, FINISH_QUEUE, marksQueue, type QueueConfig } from './names.js';
import { RedisJobStore } from './redis-store.js';
import type { MarkData } from './worker.js';

export interface QueueJobsOptions extends QueueConfig {
  /** jobs queued or running over all keys before 503 JOBS_SATURATED (default 100) */
  maxActive?: number;
  /** jobs queued or running per key before 429 JOB_QUOTA_EXCEEDED (default 10) */
  quota?: number;
  /** finished jobs are deleted this long after they finished, ms; 0 keeps them (default 7 days) */
  retentionMs?: number;
  /** attempts of a mark whose worker failed (an exception, not a failed check; default 3) */
  attempts?: number;
  now?: () => number;
  onFailure?: (id: string, err: unknown) => void;
}

/**
 * The jobs of the API on the queue backend (PLATESMITH_QUEUE): the job store in Redis, each
 * schedule a BullMQ flow (one child per mark on its key's queue, a parent on the finish queue),
 * the events from BullMQ's event stream. This process holds no job state: any number of API
 * processes serve the same jobs, and `platesmith worker` processes run them.
 */
export class QueueJobs implements Jobs {
  readonly backend = 'redis' as const;
  readonly store: RedisJobStore;
  readonly ready: Promise<void>;
  readonly #cfg: QueueConfig & { prefix: string };
  readonly #o: { maxActive: number; quota: number; retentionMs: number; attempts: number };
  readonly #flow: FlowProducer;
  readonly #finish: Queue;
  readonly #listener: EventListener;
  readonly #events: EventPublisher;
  readonly #now: () => number;
  readonly #onFailure: (id: string, err: unknown) => void;
  readonly #queues = new Map<string, Queue>();
  /** the connection of the flow producer and the queues (errors handled, ended at close) */
  readonly #client: Redis;
  #sweeper: NodeJS.Timeout | undefined;
  #stopping = false;

  constructor(opts: QueueJobsOptions) {
    this.#cfg = { url: opts.url, prefix: opts.prefix ?? DEFAULT_PREFIX };
    this.#o = {
      maxActive: opts.maxActive ?? JOB_DEFAULTS.maxActive,
      quota: opts.quota ?? JOB_DEFAULTS.quota,
      retentionMs: opts.retentionMs ?? JOB_DEFAULTS.retentionMs,
      attempts: opts.attempts ?? 3,
    };
    this.#now = opts.now ?? Date.now;
    this.#onFailure = opts.onFailure ?? (() => {});
    this.store = new RedisJobStore(this.#cfg);
    this.#client = client(this.#cfg.url, { maxRetriesPerRequest: 1, enableOfflineQueue: false });
    this.#flow = new FlowProducer({ connection: this.#client, prefix: this.#cfg.prefix });
    this.#flow.on('error', () => {});
    this.#finish = new Queue(FINISH_QUEUE, { connection: this.#client, prefix: this.#cfg.prefix });
    this.#finish.on('error', () => {});
    this.#listener = new EventListener(this.#cfg);
    this.#events = new EventPublisher(this.#cfg, this.store);
    // the API starts while Redis is down too (after 10 s): /ready says so, and job routes answer 503 until it is back
    this.ready = this.store.connected(10_000).catch(() => {});
    if (this.#o.retentionMs > 0) {
      const every = Math.min(this.#o.retentionMs / 10, 3_600_000);
      this.#sweeper = setInterval(() => void this.sweep(), Math.max(every, 1000));
      this.#sweeper.unref();
      void this.store.connected().then(() => this.sweep(), () => {});
    }
  }

  async submit(input: ScheduleJson, owner: string | null = null): Promise<JobSummary> {
    if (this.#stopping) throw new ApiError('SHUTTING_DOWN', 'the service is shutting down', { retryAfter: 5 });
    const active = await this.store.activeCount();
    if (active >= this.#o.maxActive) throw new ApiError('JOBS_SATURATED', `${active} schedule jobs are queued or running (the limit is ${this.#o.maxActive})`, { retryAfter: 5 });
    const job = newScheduleJob(input, owner, this.#now());
    const stored = await this.store.insert(job, owner !== null ? this.#o.quota : undefined);
    if (!stored) throw new ApiError('JOB_QUOTA_EXCEEDED', `this key has ${this.#o.quota} schedule jobs queued or running (its quota); wait for one to finish or cancel one`, { retryAfter: 30, extra: { quota: this.#o.quota } });
    const queueName = marksQueue(owner);
    const ch = channels(this.#cfg.prefix);
    try {
      // the key's queue first, so a worker consumes it by the time its marks are there
      await this.store.redis.sadd(ch.ownerSet, queueName);
      await this.store.redis.publish(ch.owners, queueName);
      const keep = { age: Math.max(60, Math.ceil(this.#o.retentionMs / 1000) || 7 * 86_400) };
      await this.#flow.add({
        name: 'finish',
        queueName: FINISH_QUEUE,
        data: { id: job.id },
        opts: { jobId: job.id, removeOnComplete: true, removeOnFail: keep },
        children: input.girders.map((g, index) => ({
          name: 'mark',
          queueName,
          data: { id: job.id, index, mark: g.mark, owner } satisfies MarkData,
          // the key's jobs interleave mark by mark: a mark's priority is its place in its schedule
          opts: { jobId: `${job.id}-${index}`, priority: index + 1, attempts: this.#o.attempts, backoff: { type: 'exponential', delay: 1000 }, ignoreDependencyOnFailure: true, removeOnComplete: true, removeOnFail: keep },
        })),
      });
    } catch (e) {
      // not queued: the job is failed at once (it never ran) and the client gets 503
      await this.store.updateIfActive(job.id, { status: 'failed', error: { code: 'STORE_UNAVAILABLE', message: 'the schedule could not be queued' }, finishedAt: new Date(this.#now()).toISOString() }).catch(() => {});
      throw new ApiError('STORE_UNAVAILABLE', `the schedule could not be queued: ${(e as Error).message}`, { retryAfter: 5, cause: e });
    }
    const { input: _i, result: _r, ...summary } = job;
    return summary;
  }

  subscribe(id: string, fn: (e: JobEvent) => void): () => void {
    return this.#listener.subscribe(id, fn);
  }

  async cancel(id: string): Promise<JobSummary | undefined> {
    const r = await this.store.updateIfActive(id, { status: 'cancelled', finishedAt: new Date(this.#now()).toISOString() });
    if (r === 'applied') {
      // the workers stop its running marks; its waiting marks are skipped when they are taken
      await this.store.redis.publish(channels(this.#cfg.prefix).cancel, id).catch((e: unknown) => this.#onFailure(id, e));
      await this.#events.publish(id, 'done').catch((e: unknown) => this.#onFailure(id, e));
    }
    return this.store.get(id);
  }

  async delete(id: string): Promise<boolean> {
    await this.cancel(id);
    // the flow is removed when it can be (a mark being run is locked: it is skipped when it ends)
    await this.#finish.remove(id, { removeChildren: true }).catch(() => 0);
    return this.store.delete(id);
  }

  async sweep(): Promise<number> {
    if (this.#o.retentionMs <= 0) return 0;
    try {
      return await this.store.purgeFinished(new Date(this.#now() - this.#o.retentionMs).toISOString());
    } catch (e) {
      this.#onFailure('(retention)', e);
      return 0;
    }
  }

  #queue(name: string): Queue {
    let q = this.#queues.get(name);
    if (!q) {
      q = new Queue(name, { connection: this.#client, prefix: this.#cfg.prefix });
      q.on('error', () => {});
      this.#queues.set(name, q);
    }
    return q;
  }

  async stats(): Promise<{ waiting: number; running: number; jobs: number; workers: number }> {
    const names = await this.store.redis.smembers(channels(this.#cfg.prefix).ownerSet);
    let waiting = 0;
    let running = 0;
    for (const n of names) {
      const c = await this.#queue(n).getJobCounts('waiting', 'prioritized', 'active');
      waiting += (c['waiting'] ?? 0) + (c['prioritized'] ?? 0);
      running += c['active'] ?? 0;
    }
    return { waiting, running, jobs: await this.store.activeCount(), workers: await this.#finish.getWorkersCount() };
  }

  async shutdown(): Promise<void> {
    this.#stopping = true;
    if (this.#sweeper) clearInterval(this.#sweeper);
  }

  /** closes the connections (after shutdown; the app's close does it) */
  async close(): Promise<void> {
    await Promise.allSettled([closeWithin(this.#flow, 1000), closeWithin(this.#finish, 1000), this.#listener.close(), this.#events.close(), ...[...this.#queues.values()].map((q) => closeWithin(q, 1000))]);
    this.#client.disconnect();
    await this.store.close();
  }
}
