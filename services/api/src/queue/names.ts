import { createHash } from 'node:crypto';
import { Redis, type RedisOptions } from 'ioredis';

/**
 * Names shared by the API and the worker processes of the queue backend: the Redis connection
 * from PLATESMITH_QUEUE, the key prefix, the queues and channels.
 *
 * Queues (BullMQ, under the prefix): `finish` holds one parent job per schedule (its id is the
 * schedule job's id), which finishes the schedule once its marks are done; `marks-<owner hash>`
 * holds the marks of one key's schedules (one queue per key, consumed round-robin by every
 * worker; `marks-anon` without keys), a child of the parent per mark.
 */

export interface QueueConfig {
  /** redis://[user:password@]host:port[/db] (PLATESMITH_QUEUE) */
  url: string;
  /** prefix of every key and queue (default 'platesmith'; tests give each run its own) */
  prefix?: string;
}

export const DEFAULT_PREFIX = 'platesmith';
export const FINISH_QUEUE = 'finish';

/** The queue of one owner's marks (a short digest: a key's id may hold characters a queue name may not). */
export function marksQueue(owner: string | null): string {
  return owner === null ? 'marks-anon' : `marks-${createHash('sha256').update(owner).digest('hex').slice(0, 16)}`;
}

/** The connection options of a redis:// URL (ioredis parses it too; the worker connections need maxRetriesPerRequest null). */
export function redisOptions(url: string, extra: RedisOptions = {}): RedisOptions {
  let u: URL;
  try {
    u = new URL(url);
  } catch {
    throw new Error(`PLATESMITH_QUEUE must be a redis:// URL (redis://host:port), got '${url.slice(0, 60)}'`);
  }
  if (u.protocol !== 'redis:' && u.protocol !== 'rediss:') throw new Error(`PLATESMITH_QUEUE must be a redis:// URL (redis://host:port), got '${url.slice(0, 60)}'`);
  const db = u.pathname.length > 1 ? Number(u.pathname.slice(1)) : 0;
  if (!Number.isInteger(db) || db < 0 || db > 15) throw new Error(`PLATESMITH_QUEUE: the database number must be 0 to 15, got '${u.pathname.slice(1, 20)}'`);
  const o: RedisOptions = { host: u.hostname || '127.0.0.1', port: u.port ? Number(u.port) : 6379, db, ...extra };
  if (u.username) o.username = decodeURIComponent(u.username);
  if (u.password) o.password = decodeURIComponent(u.password);
  if (u.protocol === 'rediss:') o.tls = {};
  return o;
}

/** Pub/sub channels and keys outside BullMQ's, under the prefix. */
export function channels(prefix: string) {
  return {
    /** a schedule id: its running marks stop (cancelled, failed by its budget, deleted) */
    cancel: `${prefix}:cancel`,
    /** an owner's queue name: workers start consuming it */
    owners: `${prefix}:owners`,
    /** the set of owners' queue names */
    ownerSet: `${prefix}:store:owners`,
  };
}

/**
 * Closes a BullMQ object, or disconnects it when the close takes longer than `ms` (a close waits
 * for Redis to answer: while Redis is down, a shutdown must not hang on it). Give the object a
 * client of ours (`client`) and end it after this.
 */
export async function closeWithin(o: { close(): Promise<void>; disconnect(): Promise<void> | void }, ms = 2000): Promise<void> {
  let t: NodeJS.Timeout | undefined;
  const late = new Promise<'late'>((resolve) => (t = setTimeout(() => resolve('late'), ms)));
  const r = await Promise.race([o.close().then(() => 'closed' as const, () => 'closed' as const), late]);
  clearTimeout(t);
  // BullMQ's disconnect may wait for Redis too: not awaited (the caller ends its own client)
  if (r === 'late') void Promise.resolve(o.disconnect()).catch(() => {});
}

/**
 * A Redis client of our own for a BullMQ object: its errors are handled (Redis down is reported
 * by /ready, not printed), and `disconnect()` ends it whatever BullMQ is waiting for.
 */
export function client(url: string, extra: RedisOptions = {}): Redis {
  const c = new Redis(redisOptions(url, extra));
  c.on('error', () => {});
  return c;
}
