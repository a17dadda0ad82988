import { QueueEvents, QueueEventsProducer } from 'bullmq';
import type { JobEvent } from '../jobs/jobs.js';
import type { JobSummary } from '../jobs/store.js';
import type { Redis } from 'ioredis';
import { client, closeWithin, FINISH_QUEUE, type QueueConfig } from './names.js';
import type { RedisJobStore } from './redis-store.js';

/** The name of the custom BullMQ event on the finish queue's event stream that carries a job's summary. */
export const SCHEDULE_EVENT = 'schedule';

/**
 * Publishes a job's change as a BullMQ event (the finish queue's event stream): every API process
 * listens with QueueEvents and passes it to its SSE streams, so events reach a client whichever
 * process serves it. The summary is read from the store after the write it reports.
 */
export class EventPublisher {
  readonly #producer: QueueEventsProducer;
  readonly #store: RedisJobStore;
  readonly #client: Redis;
  constructor(cfg: QueueConfig & { prefix: string }, store: RedisJobStore) {
    this.#store = store;
    this.#client = client(cfg.url, { maxRetriesPerRequest: 1, enableOfflineQueue: false });
    this.#producer = new QueueEventsProducer(FINISH_QUEUE, { connection: this.#client, prefix: cfg.prefix });
    this.#producer.on('error', () => {
      /* reconnects by itself; a lost event is one progress step (the status routes read the store) */
    });
  }
  async publish(id: string, type: JobEvent['type'], job?: JobSummary): Promise<void> {
    const j = job ?? (await this.#store.get(id));
    if (!j) return;
    await this.#producer.publishEvent({ eventName: SCHEDULE_EVENT, jobId: id, type, job: JSON.stringify(j) }, 10_000);
  }
  async close(): Promise<void> {
    await closeWithin(this.#producer, 1000);
    this.#client.disconnect();
  }
}

/** Listens to the schedule events of the queue (QueueEvents: a blocking read of the stream) and calls each job's listeners. */
export class EventListener {
  readonly events: QueueEvents;
  readonly #listeners = new Map<string, Set<(e: JobEvent) => void>>();
  readonly #client: Redis;
  constructor(cfg: QueueConfig & { prefix: string }) {
    // its own connection (a blocking read), ended by close even while Redis is down
    this.#client = client(cfg.url, { maxRetriesPerRequest: null });
    this.events = new QueueEvents(FINISH_QUEUE, { connection: this.#client, prefix: cfg.prefix, blockingTimeout: 5000 });
    this.events.on('error', () => {
      /* reconnects by itself; /ready reports the store's connection */
    });
    this.events.on(SCHEDULE_EVENT as never, ((args: { jobId: string; type: JobEvent['type']; job: string }) => {
      const set = this.#listeners.get(args.jobId);
      if (!set) return;
      const e: JobEvent = { type: args.type, job: JSON.parse(args.job) as JobSummary };
      for (const fn of set) fn(e);
    }) as never);
  }
  subscribe(id: string, fn: (e: JobEvent) => void): () => void {
    let set = this.#listeners.get(id);
    if (!set) this.#listeners.set(id, (set = new Set()));
    set.add(fn);
    return () => {
      set.delete(fn);
      if (set.size === 0) this.#listeners.delete(id);
    };
  }
  async ready(): Promise<void> {
    await this.events.waitUntilReady();
  }
  async close(): Promise<void> {
    await closeWithin(this.events, 1000);
    this.#client.disconnect();
  }
}
