/**
 * The worker process's entry in the image (docker/compose.yaml: `node dist/worker-main.js`); from
 * a clone, `pnpm platesmith worker` does the same. Needs PLATESMITH_QUEUE.
 */
import { startWorker } from './queue/run-worker.js';

startWorker().catch((e: unknown) => {
  process.stderr.write(`platesmith worker failed to start: ${(e as Error).message}\n`);
  process.exit(1);
});
