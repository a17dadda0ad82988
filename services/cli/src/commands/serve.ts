import type { Out } from '../io.js';

/** The part of @platesmith/api this command uses (imported at run time, so the CLI loads fast). */
interface ApiModule {
  startServer(opts?: { host?: string; port?: number }): Promise<{ url: string; close: () => Promise<void> }>;
}

/** `serve`: starts the HTTP API on HOST:PORT (default 127.0.0.1:8080) until SIGINT/SIGTERM. */
export async function runServe(io: Out): Promise<number> {
  const spec = '@platesmith/api';
  const api = (await import(spec)) as ApiModule;
  const { url } = await api.startServer();
  io.err(`platesmith API listening on ${url} (docs at ${url}/docs)`);
  return new Promise<number>(() => {
    /* runs until the process is signalled; close-with-grace in the server exits */
  });
}
