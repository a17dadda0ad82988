import { createEngine } from '@platesmith/app';
import closeWithGrace from 'close-with-grace';
import { pino } from 'pino';
import { optionsFromEnv } from '../settings.js';
import { settingsFromEnv } from '../team-settings.js';
import { QueueWorker } from './worker.js';

function ms(env: NodeJS.ProcessEnv, name: string, min: number): number | undefined {
  const v = env[name]?.trim();
  if (!v) return undefined;
  if (!/^[0-9]{1,9}$/.test(v) || Number(v) < min) throw new Error(`${name} must be a whole number of ms, at least ${min}, got '${v.slice(0, 40)}'`);
  return Number(v);
}

/**
 * `platesmith worker`: a process that takes marks and the finishing of schedules from the queue
 * (PLATESMITH_QUEUE) and searches on its own worker threads (PLATESMITH_THREADS). Mark and job
 * budgets as the API's (PLATESMITH_MARK_BUDGET, PLATESMITH_JOB_BUDGET). SIGTERM or SIGINT: stops
 * taking marks, lets the running one finish within `graceMs` (default 8 s) or puts it back in its
 * queue, and exits.
 */
export async function startWorker(opts: { env?: NodeJS.ProcessEnv; graceMs?: number; exitOnSignal?: boolean } = {}): Promise<{ worker: QueueWorker; close: () => Promise<void> }> {
  const env = opts.env ?? process.env;
  const o = optionsFromEnv(env);
  if (!o.queue) throw new Error('platesmith worker needs PLATESMITH_QUEUE=redis://host:port (the Redis the API queues schedules on)');
  const team = settingsFromEnv(env);
  const log = pino({ level: env['LOG_LEVEL'] ?? 'info', base: { role: 'worker', pid: process.pid } }, pino.destination({ dest: 2, sync: true }));
  const engine = createEngine({ ...(o.threads !== undefined ? { threads: o.threads } : {}), onError: (err) => log.error({ err }, 'worker pool error') });
  await engine.ping(AbortSignal.timeout(60_000));
  const lock = ms(env, 'PLATESMITH_QUEUE_LOCK_MS', 100);
  const stalled = ms(env, 'PLATESMITH_QUEUE_STALLED_MS', 100);
  const worker = new QueueWorker({
    ...o.queue,
    engine,
    ...(team.jobs?.markBudgetMs !== undefined ? { markBudgetMs: team.jobs.markBudgetMs } : {}),
    ...(team.jobs?.jobBudgetMs !== undefined ? { jobBudgetMs: team.jobs.jobBudgetMs } : {}),
    ...(lock !== undefined ? { lockDurationMs: lock } : {}),
    ...(stalled !== undefined ? { stalledIntervalMs: stalled } : {}),
    log,
  });
  await worker.start();
  log.info({ threads: engine.threads }, 'platesmith worker taking marks');
  let closed: Promise<void> | undefined;
  const close = () =>
    (closed ??= (async () => {
      await worker.close(opts.graceMs ?? 8000);
      await engine.close();
      log.info({ counts: worker.counts }, 'platesmith worker stopped');
    })());
  if (opts.exitOnSignal !== false) {
    // past 10 s close-with-grace exits at once
    closeWithGrace({ delay: 10_000 }, async ({ signal, err }) => {
      if (err) log.error({ err }, 'closing after an uncaught error');
      else log.info({ signal }, 'closing: the running mark finishes or goes back to its queue');
      await close();
      // a connection still retrying a Redis that is down must not keep the process alive
      setTimeout(() => process.exit(0), 1000).unref();
    });
  }
  return { worker, close };
}
