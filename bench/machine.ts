import { Worker } from 'node:worker_threads';

/**
 * What this machine's two cores give right now, for reading the figures: the same fixed arithmetic
 * loop timed alone, then on two threads at once (slowest of the two). On a shared host both swing
 * (on this project's machine the mono-symmetric figure and the paired loop moved together by ~2x
 * from one hour to the next), so figures from different runs compare only beside these.
 */
const LOOP = 'let s = 0; for (let i = 1; i < 2e7; i++) s += Math.sqrt(i) % 7; return s;';
function loopMs(): number {
  const t0 = performance.now();
  new Function(LOOP)();
  return performance.now() - t0;
}
export async function machineReference(): Promise<{ loopMsAlone: number; loopMsPaired: number }> {
  loopMs();
  const alone = loopMs();
  const w = new Worker(
    `const { parentPort } = require('node:worker_threads'); parentPort.once('message', () => { const t0 = performance.now(); (function () { ${LOOP} })(); parentPort.postMessage(performance.now() - t0); });`,
    { eval: true },
  );
  await new Promise((r) => w.once('online', r));
  const other = new Promise<number>((r) => w.once('message', r));
  w.postMessage('go');
  const mine = loopMs();
  const paired = Math.max(mine, await other);
  await w.terminate();
  return { loopMsAlone: Math.round(alone), loopMsPaired: Math.round(paired) };
}

/** The line the benchmarks print first: figures compare only beside it. */
export const machineLine = (m: { loopMsAlone: number; loopMsPaired: number }): string =>
  `machine reference: a fixed loop takes ${m.loopMsAlone} ms alone, ${m.loopMsPaired} ms on two threads at once`;
