import type { FastifyPluginAsync } from 'fastify';
import { collectDefaultMetrics, Gauge, Registry } from 'prom-client';
import { z } from 'zod';

/**
 * GET /metrics: Prometheus text format (prom-client), on either backend: marks waiting and
 * running, schedule jobs queued or running, processes taking marks, whether the job store
 * answers, searches on this process's pool, and the process's own figures (prom-client's
 * defaults). Behind the keys when keys are on (plugins/access.ts).
 */
export const metricsRoutes: FastifyPluginAsync = async (app) => {
  const register = new Registry();
  const backend = app.jobs.backend;
  register.setDefaultLabels({ backend });
  collectDefaultMetrics({ register, prefix: 'platesmith_process_' });
  // one read of the backend per scrape, shared by the gauges
  let pending: Promise<Awaited<ReturnType<typeof app.jobs.stats>> | null> | null = null;
  const stats = () => {
    pending ??= app.jobs.stats().catch(() => null).finally(() => setImmediate(() => (pending = null)));
    return pending;
  };
  const gauge = (name: string, help: string, read: (s: NonNullable<Awaited<ReturnType<typeof stats>>>) => number) =>
    new Gauge({
      name,
      help,
      registers: [register],
      async collect() {
        const s = await stats();
        // NaN when the store does not answer (Prometheus shows the gap; platesmith_job_store_up says why)
        this.set(s ? read(s) : Number.NaN);
      },
    });
  gauge('platesmith_queue_waiting_marks', 'marks of schedule jobs waiting for a worker', (s) => s.waiting);
  gauge('platesmith_queue_active_marks', 'marks of schedule jobs being searched', (s) => s.running);
  gauge('platesmith_jobs_active', 'schedule jobs queued or running', (s) => s.jobs);
  gauge('platesmith_workers', 'processes taking marks (embedded: this one; queue: platesmith worker processes connected)', (s) => s.workers);
  new Gauge({ name: 'platesmith_job_store_up', help: '1 when the job store answers (SQLite usable, or Redis connected), else 0', registers: [register], collect() {
    this.set(app.jobs.store.health().ok ? 1 : 0);
  } });
  new Gauge({ name: 'platesmith_searches_active', help: 'checks, analyses and searches on this process\'s worker pool', registers: [register], collect() {
    this.set(app.engine.active());
  } });
  new Gauge({ name: 'platesmith_threads', help: 'worker threads of this process\'s pool', registers: [register], collect() {
    this.set(app.engine.threads);
  } });

  app.get(
    '/metrics',
    {
      schema: {
        operationId: 'getMetrics',
        tags: ['service'],
        summary: 'Metrics in the Prometheus text format: queue depth, active marks and jobs, workers, job store up (behind the keys when keys are on)',
        response: { 200: { description: 'Prometheus text exposition format 0.0.4', content: { 'text/plain': { schema: z.string() } } } },
      },
    },
    async (_req, reply) => reply.type(register.contentType).send((await register.metrics()) as never),
  );
};
