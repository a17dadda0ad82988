import { Redis } from 'ioredis';
import type { MarkResult, ScheduleRunResult } from '@platesmith/schedule';
import { ApiError } from '../errors.js';
import type { JobPatch, JobRecord, JobState, JobStore, JobSummary, StoreHealth } from '../jobs/store.js';
import { DEFAULT_PREFIX, redisOptions } from './names.js';

/**
 * The job store of the queue backend, in Redis: the same rules as the SQLite store (JobStore),
 * so every API process and worker reads and writes the same jobs and no process holds job state.
 *
 * Keys under `<prefix>:store:`: `job:<id>` a hash of the summary's fields (each JSON), with
 * `:input`, `:result` (strings) and `:marks` (a hash index → mark JSON) beside it; `jobs` and
 * `jobs:<owner>` (sorted by creation), `active` and `active:<owner>` (queued or running, the
 * quota's count), `finished` (sorted by finish time, for retention).
 *
 * - quota: counted and inserted in one Lua script, so concurrent submits to several API
 *   processes cannot pass it together;
 * - `update` writes the patch's fields (HSET), never reads the input or result;
 * - a mark is stored once (`putMarkOnce`: HSETNX): delivery of a mark is at-least-once (a worker
 *   killed after storing it leaves the job to another), so a mark may be computed twice and is
 *   never stored twice; the progress is counted from the marks stored, in the same script;
 * - `updateIfActive` (cancellation, failure, the final write) never changes a finished job, so a
 *   late worker cannot overwrite a cancel;
 * - failures: Redis unreachable → ApiError STORE_UNAVAILABLE (503) and `health()` false with the
 *   cause; the connection reconnects by itself and health follows it.
 *
 * The scripts build a few keys from the prefix and the owner stored in the job (one Redis
 * instance, as BullMQ's open-source edition needs; not a Redis Cluster layout).
 */

const TERMINAL_LUA = `local function terminal(s) return s == '"done"' or s == '"failed"' or s == '"cancelled"' end`;

const INSERT = `
if redis.call('EXISTS', KEYS[1]) == 1 then return -1 end
local q = tonumber(ARGV[2])
if q >= 0 and redis.call('SCARD', KEYS[3]) >= q then return 0 end
redis.call('HSET', KEYS[1], unpack(ARGV, 5))
redis.call('SET', KEYS[2], ARGV[4])
redis.call('SADD', KEYS[3], ARGV[1])
redis.call('SADD', KEYS[4], ARGV[1])
redis.call('ZADD', KEYS[5], ARGV[3], ARGV[1])
redis.call('ZADD', KEYS[6], ARGV[3], ARGV[1])
return 1`;

/** ARGV: id, guard ('1': leave a finished job as it is), new status JSON or '', finished ms or '', result JSON or '', prefix, field/value pairs */
const UPDATE = `${TERMINAL_LUA}
if redis.call('EXISTS', KEYS[1]) == 0 then return 0 end
if ARGV[2] == '1' and terminal(redis.call('HGET', KEYS[1], 'status')) then return 2 end
if #ARGV > 6 then redis.call('HSET', KEYS[1], unpack(ARGV, 7)) end
if ARGV[5] ~= '' then redis.call('SET', KEYS[2], ARGV[5]) end
local st = ARGV[3]
if st ~= '' then
  local ok = redis.call('HGET', KEYS[1], '_ownerKey')
  local ak = ARGV[6] .. ':store:active:' .. ok
  if terminal(st) then
    redis.call('SREM', ak, ARGV[1])
    redis.call('SREM', KEYS[3], ARGV[1])
    redis.call('ZADD', KEYS[4], tonumber(ARGV[4]), ARGV[1])
  else
    redis.call('SADD', ak, ARGV[1])
    redis.call('SADD', KEYS[3], ARGV[1])
    redis.call('ZREM', KEYS[4], ARGV[1])
  end
end
return 1`;

const DELETE = `
if redis.call('EXISTS', KEYS[1]) == 0 then return 0 end
local ok = redis.call('HGET', KEYS[1], '_ownerKey')
redis.call('DEL', KEYS[1], KEYS[2], KEYS[3], KEYS[4])
redis.call('SREM', KEYS[5], ARGV[1])
redis.call('SREM', ARGV[2] .. ':store:active:' .. ok, ARGV[1])
redis.call('ZREM', KEYS[6], ARGV[1])
redis.call('ZREM', ARGV[2] .. ':store:jobs:' .. ok, ARGV[1])
redis.call('ZREM', KEYS[7], ARGV[1])
return 1`;

/**
 * A worker begins a mark: a queued job becomes running (startedAt set once), the progress names
 * the mark; `resumed` counts a mark taken up again after its worker stopped. Returns the status
 * (JSON) as it is now: a finished job's marks are skipped.
 * ARGV: startedAt JSON, now ms, mark name JSON, resumed increment
 */
const BEGIN = `${TERMINAL_LUA}
local st = redis.call('HGET', KEYS[1], 'status')
if not st then return false end
if terminal(st) then return st end
if st == '"queued"' then
  redis.call('HSET', KEYS[1], 'status', '"running"', 'startedAt', ARGV[1], '_startedMs', ARGV[2])
end
if tonumber(ARGV[4]) > 0 then redis.call('HINCRBY', KEYS[1], 'resumed', tonumber(ARGV[4])) end
local total = tonumber(redis.call('HGET', KEYS[1], 'marks'))
local p = cjson.decode(redis.call('HGET', KEYS[1], 'progress'))
if p == cjson.null then p = { marksDone = redis.call('HLEN', KEYS[2]), marksTotal = total, elapsedMs = 0, estimateMs = cjson.null } end
p.currentMark = cjson.decode(ARGV[3])
redis.call('HSET', KEYS[1], 'progress', cjson.encode(p))
return '"running"'`;

/**
 * Stores a finished mark once (HSETNX) and the progress counted from the marks stored; a finished
 * job's marks are not stored. ARGV: index, mark JSON, now ms. Returns 1 stored, 0 already there
 * (or the job finished), -1 unknown job.
 */
const PUT_MARK_ONCE = `${TERMINAL_LUA}
local st = redis.call('HGET', KEYS[1], 'status')
if not st then return -1 end
if terminal(st) then return 0 end
local stored = redis.call('HSETNX', KEYS[2], ARGV[1], ARGV[2])
if stored == 0 then return 0 end
local n = redis.call('HLEN', KEYS[2])
local total = tonumber(redis.call('HGET', KEYS[1], 'marks'))
local started = tonumber(redis.call('HGET', KEYS[1], '_startedMs') or ARGV[3])
local elapsed = tonumber(ARGV[3]) - started
local p = cjson.decode(redis.call('HGET', KEYS[1], 'progress'))
local cur = cjson.null
if p ~= cjson.null and p.currentMark then cur = p.currentMark end
if n >= total then cur = cjson.null end
local np = { marksDone = n, marksTotal = total, currentMark = cur, elapsedMs = elapsed, estimateMs = elapsed / n * (total - n) }
redis.call('HSET', KEYS[1], 'progress', cjson.encode(np))
return 1`;

const FIELDS = ['id', 'kind', 'owner', 'status', 'name', 'marks', 'createdAt', 'startedAt', 'finishedAt', 'progress', 'error', 'resumed'] as const;

export interface RedisJobStoreOptions {
  url: string;
  prefix?: string;
}

export class RedisJobStore implements JobStore {
  readonly redis: Redis;
  readonly prefix: string;
  readonly #k: string;
  #lastError = 'not connected yet';

  constructor(opts: RedisJobStoreOptions) {
    this.prefix = opts.prefix ?? DEFAULT_PREFIX;
    this.#k = `${this.prefix}:store:`;
    // fail fast while Redis is down (a 503 at once, not a request held until it returns); it reconnects by itself
    this.redis = new Redis(redisOptions(opts.url, { maxRetriesPerRequest: 1, enableOfflineQueue: false, lazyConnect: false, retryStrategy: (n) => Math.min(200 * n, 2000) }));
    this.redis.on('error', (e: Error) => {
      this.#lastError = e.message;
    });
    this.redis.defineCommand('psInsert', { numberOfKeys: 6, lua: INSERT });
    this.redis.defineCommand('psUpdate', { numberOfKeys: 4, lua: UPDATE });
    this.redis.defineCommand('psDelete', { numberOfKeys: 7, lua: DELETE });
    this.redis.defineCommand('psBegin', { numberOfKeys: 2, lua: BEGIN });
    this.redis.defineCommand('psPutMarkOnce', { numberOfKeys: 2, lua: PUT_MARK_ONCE });
  }

  /** resolves once connected (rejects after `ms`) */
  async connected(ms = 10_000): Promise<void> {
    if (this.redis.status === 'ready') return;
    await new Promise<void>((resolve, reject) => {
      const t = setTimeout(() => reject(new Error(`Redis did not answer within ${ms} ms: ${this.#lastError}`)), ms);
      this.redis.once('ready', () => {
        clearTimeout(t);
        resolve();
      });
    });
  }

  #job = (id: string) => `${this.#k}job:${id}`;
  #ownerKey = (owner: string | null) => (owner === null ? 'anon' : Buffer.from(owner).toString('hex'));

  async #do<T>(fn: (r: Redis & Record<string, (...a: unknown[]) => Promise<unknown>>) => Promise<T>): Promise<T> {
    try {
      return await fn(this.redis as never);
    } catch (e) {
      if (e instanceof ApiError) throw e;
      throw new ApiError('STORE_UNAVAILABLE', `the job store (Redis) did not answer: ${(e as Error).message}`, { retryAfter: 5, cause: e });
    }
  }

  #decode(h: Record<string, string>): JobSummary | undefined {
    if (!h['id']) return undefined;
    const o: Record<string, unknown> = {};
    for (const f of FIELDS) o[f] = h[f] !== undefined ? JSON.parse(h[f]!) : null;
    o['resumed'] = Number(h['resumed'] ?? 0);
    return o as unknown as JobSummary;
  }

  async insert(job: JobRecord, quota?: number): Promise<boolean> {
    const ok = this.#ownerKey(job.owner);
    const pairs: string[] = [];
    for (const f of FIELDS) pairs.push(f, f === 'resumed' ? String(job.resumed) : JSON.stringify(job[f]));
    pairs.push('_ownerKey', ok, 'spentMs', '0');
    const r = await this.#do((c) =>
      c['psInsert']!(this.#job(job.id), `${this.#job(job.id)}:input`, `${this.#k}active:${ok}`, `${this.#k}active`, `${this.#k}jobs`, `${this.#k}jobs:${ok}`,
        job.id, quota === undefined ? -1 : quota, Date.parse(job.createdAt), JSON.stringify(job.input), ...pairs),
    );
    if (r === -1) throw new Error(`job ${job.id} exists`);
    return r === 1;
  }

  async get(id: string): Promise<JobSummary | undefined> {
    return this.#decode(await this.#do((c) => c.hgetall(this.#job(id))));
  }

  async input(id: string): Promise<JobRecord['input'] | undefined> {
    const s = await this.#do((c) => c.get(`${this.#job(id)}:input`));
    return s === null ? undefined : JSON.parse(s);
  }

  async result(id: string): Promise<ScheduleRunResult | null | undefined> {
    const [exists, s] = await this.#do((c) => Promise.all([c.exists(this.#job(id)), c.get(`${this.#job(id)}:result`)]));
    if (!exists) return undefined;
    return s === null ? null : JSON.parse(s);
  }

  async #update(id: string, patch: JobPatch, guard: boolean): Promise<number> {
    const pairs: string[] = [];
    for (const [f, v] of Object.entries(patch)) {
      if (f === 'result' || v === undefined) continue;
      pairs.push(f, f === 'resumed' ? String(v) : JSON.stringify(v));
    }
    const terminal = patch.status === 'done' || patch.status === 'failed' || patch.status === 'cancelled';
    const finishedMs = terminal ? String(patch.finishedAt ? Date.parse(patch.finishedAt) : Date.now()) : '';
    const r = await this.#do((c) =>
      c['psUpdate']!(this.#job(id), `${this.#job(id)}:result`, `${this.#k}active`, `${this.#k}finished`,
        id, guard ? '1' : '0', patch.status !== undefined ? JSON.stringify(patch.status) : '', finishedMs, patch.result ? JSON.stringify(patch.result) : '', this.prefix, ...pairs),
    );
    return Number(r);
  }

  async update(id: string, patch: JobPatch): Promise<boolean> {
    return (await this.#update(id, patch, false)) !== 0;
  }

  /** writes the patch unless the job is finished: 'applied', 'finished' (left as it was) or 'unknown' */
  async updateIfActive(id: string, patch: JobPatch): Promise<'applied' | 'finished' | 'unknown'> {
    const r = await this.#update(id, patch, true);
    return r === 1 ? 'applied' : r === 2 ? 'finished' : 'unknown';
  }

  async list(query: { limit: number; status?: JobState; owner?: string | null }): Promise<JobSummary[]> {
    const z = query.owner === undefined ? `${this.#k}jobs` : `${this.#k}jobs:${this.#ownerKey(query.owner)}`;
    const out: JobSummary[] = [];
    // newest first, a page at a time; at most 10 000 jobs looked at (retention keeps far fewer)
    for (let start = 0; out.length < query.limit && start < 10_000; start += 200) {
      const ids = await this.#do((c) => c.zrevrange(z, start, start + 199));
      if (ids.length === 0) break;
      const p = this.redis.pipeline();
      for (const id of ids) p.hgetall(this.#job(id));
      const rows = (await this.#do(() => p.exec())) ?? [];
      for (const [err, h] of rows) {
        const j = err ? undefined : this.#decode(h as Record<string, string>);
        if (j && (query.status === undefined || j.status === query.status)) out.push(j);
        if (out.length >= query.limit) break;
      }
    }
    return out;
  }

  async delete(id: string): Promise<boolean> {
    const j = this.#job(id);
    const r = await this.#do((c) => c['psDelete']!(j, `${j}:input`, `${j}:result`, `${j}:marks`, `${this.#k}active`, `${this.#k}jobs`, `${this.#k}finished`, id, this.prefix));
    return r === 1;
  }

  async putMark(id: string, index: number, mark: MarkResult): Promise<void> {
    await this.#do(async (c) => {
      if (await c.exists(this.#job(id))) await c.hset(`${this.#job(id)}:marks`, String(index), JSON.stringify(mark));
    });
  }

  /** stores a finished mark unless one is stored for that index (or the job is finished); true when this call stored it */
  async putMarkOnce(id: string, index: number, mark: MarkResult): Promise<boolean> {
    const r = await this.#do((c) => c['psPutMarkOnce']!(this.#job(id), `${this.#job(id)}:marks`, String(index), JSON.stringify(mark), Date.now()));
    return r === 1;
  }

  /** a worker begins a mark of job `id`: its status now (a finished job's marks are skipped), undefined for an unknown job */
  async begin(id: string, mark: string, resumed: boolean): Promise<JobState | undefined> {
    const r = await this.#do((c) => c['psBegin']!(this.#job(id), `${this.#job(id)}:marks`, JSON.stringify(new Date().toISOString()), Date.now(), JSON.stringify(mark), resumed ? 1 : 0));
    return r === null ? undefined : (JSON.parse(String(r)) as JobState);
  }

  /** adds `ms` to the search time job `id` has taken; the total */
  async spend(id: string, ms: number): Promise<number> {
    return Number(await this.#do((c) => c.hincrbyfloat(this.#job(id), 'spentMs', ms.toFixed(3))));
  }

  async marks(id: string): Promise<{ index: number; mark: MarkResult }[]> {
    const h = await this.#do((c) => c.hgetall(`${this.#job(id)}:marks`));
    return Object.entries(h)
      .map(([i, m]) => ({ index: Number(i), mark: JSON.parse(m) as MarkResult }))
      .sort((a, b) => a.index - b.index);
  }

  /** how many marks are stored (HLEN) */
  async markCount(id: string): Promise<number> {
    return this.#do((c) => c.hlen(`${this.#job(id)}:marks`));
  }

  async unfinished(): Promise<JobSummary[]> {
    const ids = await this.#do((c) => c.smembers(`${this.#k}active`));
    const all = await Promise.all(ids.map((id) => this.get(id)));
    return all.filter((j): j is JobSummary => j !== undefined).sort((a, b) => (a.createdAt < b.createdAt ? -1 : 1));
  }

  /** jobs queued or running over all keys */
  async activeCount(): Promise<number> {
    return this.#do((c) => c.scard(`${this.#k}active`));
  }

  async purgeFinished(before: string): Promise<number> {
    const ids = await this.#do((c) => c.zrangebyscore(`${this.#k}finished`, '-inf', `(${Date.parse(before)}`));
    let n = 0;
    for (const id of ids) if (await this.delete(id)) n++;
    return n;
  }

  health(): StoreHealth {
    return this.redis.status === 'ready' ? { ok: true } : { ok: false, cause: `Redis (PLATESMITH_QUEUE) is not reachable: ${this.#lastError} (connection ${this.redis.status})` };
  }

  async close(): Promise<void> {
    this.redis.disconnect();
  }
}
