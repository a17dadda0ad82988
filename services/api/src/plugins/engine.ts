import { createEngine, type Engine, type EngineOptions } from '@platesmith/app';
import fp from 'fastify-plugin';

export interface EnginePluginOptions extends EngineOptions {
  /** how long the boot ping may take, ms (default 60 000) */
  bootPingMs?: number;
  /** after the boot ping, run small invented searches in the background so the first user's search finds the workers compiled (default off) */
  warmUp?: boolean;
}

declare module 'fastify' {
  interface FastifyInstance {
    engine: Engine;
  }
}

/** The application engine of this process (one worker pool for every heavy request), closed with the app. */
export const enginePlugin = fp<EnginePluginOptions>(
  async (app, opts) => {
    const { bootPingMs, warmUp, ...engineOpts } = opts;
    const engine = createEngine({ ...engineOpts, onError: (e) => app.log.error({ err: e }, 'worker pool error') });
    app.decorate('engine', engine);
    // fail fast when the worker module cannot load (a missing build, a bad loader)
    const warming = new AbortController();
    app.addHook('onReady', async () => {
      await engine.ping(AbortSignal.timeout(bootPingMs ?? 60_000));
      if (warmUp) {
        // not awaited: the service is ready at once, and searches that arrive meanwhile queue behind it
        engine.warmUp(2, warming.signal).then(
          (ms) => app.log.info({ ms: Math.round(ms) }, 'search workers warmed up'),
          (err: unknown) => {
            if (!warming.signal.aborted) app.log.warn({ err }, 'search warm-up failed (searches still work, the first is slower)');
          },
        );
      }
    });
    app.addHook('onClose', async () => {
      warming.abort();
      await engine.close();
    });
  },
  { name: 'platesmith-engine' },
);
