import closeWithGrace from 'close-with-grace';
import { buildApp, type ApiOptions } from './app.js';
import { openJobStore } from './jobs/sqlite.js';
import { isLoopback, settingsFromEnv } from './team-settings.js';
import { optionsFromEnv } from './settings.js';

/**
 * Starts the service: HOST and PORT from the environment (default 127.0.0.1:8080), pino logs at
 * LOG_LEVEL (info), schedule jobs in SQLite (PLATESMITH_DB) or, with PLATESMITH_QUEUE, on the queue backend. On SIGINT/SIGTERM: stop accepting, answer in-flight requests with
 * "connection: close", cancel running schedule jobs, close the worker pool. Once ready it warms the
 * search workers up in the background (a few small invented searches, ~2 s on 2 cores).
 */
export async function startServer(opts: ApiOptions & { host?: string; port?: number; graceMs?: number } = {}): Promise<{ url: string; close: () => Promise<void> }> {
  // keys, rate limit, quota, budgets, retention (README: "Running it for a team"); a malformed one stops the start
  const team = settingsFromEnv();
  const env = optionsFromEnv();
  // the queue backend (PLATESMITH_QUEUE): jobs in Redis, run by `platesmith worker` processes; else
  // jobs are kept in SQLite (PLATESMITH_DB, default .platesmith/jobs.sqlite) so a restart loses no finished mark
  const queue = opts.queue ?? env.queue;
  const jobStore = queue ? undefined : (opts.jobStore ?? openJobStore());
  const app = await buildApp({ logger: { level: process.env.LOG_LEVEL ?? 'info' }, warmUp: true, ...env, ...team, ...opts, jobs: { ...team.jobs, ...opts.jobs }, ...(jobStore ? { jobStore } : {}), ...(queue ? { queue } : {}) });
  const keys = opts.keys !== undefined ? opts.keys : team.keys;
  // keys rotate without a restart: SIGHUP re-reads PLATESMITH_API_KEYS_FILE (a bad file keeps the keys held)
  const onHup = (): void => {
    if (!keys?.file) return void app.log.warn('SIGHUP: no PLATESMITH_API_KEYS_FILE to re-read');
    try {
      app.log.info({ keys: keys.reload() }, 'API keys re-read');
    } catch (err) {
      app.log.error({ err }, 'API keys file not re-read; the keys held stay');
    }
  };
  process.on('SIGHUP', onHup);
  app.addHook('onClose', async () => void process.off('SIGHUP', onHup));
  const host = opts.host ?? process.env.HOST ?? '127.0.0.1';
  const port = opts.port ?? Number(process.env.PORT ?? 8080);
  // SIGTERM exits within 10 s whatever runs: past the grace, close-with-grace exits at once;
  // SIGHUP re-reads the keys (above), it does not close the service
  const grace = closeWithGrace({ delay: opts.graceMs ?? 8_000, skip: ['SIGHUP'] }, async ({ signal, err }) => {
    if (err) app.log.error({ err }, 'closing after an uncaught error');
    else app.log.info({ signal }, 'closing');
    await app.close();
  });
  app.addHook('onClose', async () => grace.uninstall());
  const url = await app.listen({ host, port });
  if (!keys && !isLoopback(host)) {
    app.log.warn({ host }, 'serving on a non-loopback address without API keys: anyone who reaches it can run, read and delete every job; set PLATESMITH_API_KEYS or PLATESMITH_API_KEYS_FILE');
  }
  return { url, close: () => app.close() };
}

const isEntry = process.argv[1] !== undefined && import.meta.url === new URL(`file://${process.argv[1]}`).href;
if (isEntry) {
  startServer().catch((e: unknown) => {
    process.stderr.write(`platesmith api failed to start: ${(e as Error).message}\n`);
    process.exit(1);
  });
}
