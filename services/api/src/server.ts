import closeWithGrace from 'close-with-grace';
import { buildApp, type ApiOptions } from './app.js';
import { openJobStore } from './jobs/sqlite.js';
import { optionsFromEnv } from './settings.js';

/**
 * Starts the service: HOST and PORT from the environment (default 127.0.0.1:8080), pino logs at
 * LOG_LEVEL (info), schedule jobs in SQLite (PLATESMITH_DB). On SIGINT/SIGTERM: stop accepting, answer in-flight requests with
 * "connection: close", cancel running schedule jobs, close the worker pool. Once ready it warms the
 * search workers up in the background (a few small invented searches, ~2 s on 2 cores).
 */
export async function startServer(opts: ApiOptions & { host?: string; port?: number; graceMs?: number } = {}): Promise<{ url: string; close: () => Promise<void> }> {
  // jobs are kept in SQLite (PLATESMITH_DB, default .platesmith/jobs.sqlite) so a restart loses no finished mark
  const jobStore = opts.jobStore ?? openJobStore();
  const app = await buildApp({ logger: { level: process.env.LOG_LEVEL ?? 'info' }, warmUp: true, ...optionsFromEnv(), ...opts, jobStore });
  const host = opts.host ?? process.env.HOST ?? '127.0.0.1';
  const port = opts.port ?? Number(process.env.PORT ?? 8080);
  // SIGTERM exits within 10 s whatever runs: past the grace, close-with-grace exits at once
  const grace = closeWithGrace({ delay: opts.graceMs ?? 8_000 }, async ({ signal, err }) => {
    if (err) app.log.error({ err }, 'closing after an uncaught error');
    else app.log.info({ signal }, 'closing');
    await app.close();
  });
  app.addHook('onClose', async () => grace.uninstall());
  const url = await app.listen({ host, port });
  return { url, close: () => app.close() };
}

const isEntry = process.argv[1] !== undefined && import.meta.url === new URL(`file://${process.argv[1]}`).href;
if (isEntry) {
  startServer().catch((e: unknown) => {
    process.stderr.write(`platesmith api failed to start: ${(e as Error).message}\n`);
    process.exit(1);
  });
}
