import { EXIT, type Out } from '../io.js';

/** The part of @platesmith/api this command uses (imported at run time, so the CLI loads fast). */
interface ApiModule {
  startWorker(): Promise<unknown>;
}

/** `worker`: takes marks from the queue (PLATESMITH_QUEUE) on this process's threads until SIGINT/SIGTERM. */
export async function runWorker(io: Out): Promise<number> {
  const spec = '@platesmith/api';
  const api = (await import(spec)) as ApiModule;
  try {
    await api.startWorker();
  } catch (e) {
    // a missing or malformed setting, or Redis not answering: said plainly, exit 2
    io.err(`error: ${(e as Error).message}`);
    return EXIT.badInput;
  }
  io.err('platesmith worker taking marks from the queue');
  return new Promise<number>(() => {
    /* runs until the process is signalled; close-with-grace in the worker exits */
  });
}
