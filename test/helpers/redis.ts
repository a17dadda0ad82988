import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';

/**
 * Redis for the queue backend's tests: `redis-server` (Debian's package; .ci/run installs it) on a
 * free loopback port, no persistence. `sharedRedis()` takes the one CI started
 * (PLATESMITH_TEST_REDIS) when there is one; tests that stop Redis start their own. Every test
 * gives its jobs their own key prefix (`testPrefix()`), so tests can share one Redis.
 */
export interface RedisServer {
  url: string;
  port: number;
  /** stops it (SIGTERM) and waits for the exit; a no-op for the shared one */
  stop(): Promise<void>;
  proc: ChildProcess | null;
}

/**
 * Whether the queue backend's tests can run: CI's Redis (PLATESMITH_TEST_REDIS: then never
 * skipped) or redis-server installed. Without either they are skipped with a message, as the
 * browser test is without chromium.
 */
export const HAVE_REDIS = Boolean(process.env['PLATESMITH_TEST_REDIS']) || spawnSync('redis-server', ['--version'], { stdio: 'ignore' }).status === 0;
export const NO_REDIS = 'SKIPPED: redis-server is missing (run scripts/install-redis.sh, or set CI to install it)';

async function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const s = createServer();
    s.once('error', reject);
    s.listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port;
      s.close(() => resolve(port));
    });
  });
}

/** Starts redis-server on a free loopback port (or on `port`); retries another port when the one found was taken meanwhile. */
export async function startRedis(port?: number): Promise<RedisServer> {
  let lastError = '';
  for (let attempt = 0; attempt < 5; attempt++) {
    const p = port ?? (await freePort());
    const proc = spawn('redis-server', ['--port', String(p), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no', '--daemonize', 'no', '--loglevel', 'notice'], { stdio: ['ignore', 'pipe', 'pipe'] });
    const ok = await new Promise<boolean>((resolve) => {
      let out = '';
      const t = setTimeout(() => resolve(false), 10_000);
      const onData = (d: Buffer) => {
        out += String(d);
        if (/Ready to accept connections/i.test(out)) {
          clearTimeout(t);
          resolve(true);
        }
      };
      proc.stdout!.on('data', onData);
      proc.stderr!.on('data', onData);
      proc.once('error', (e) => {
        lastError = (e as NodeJS.ErrnoException).code === 'ENOENT' ? 'redis-server is not installed (apt-get install redis-server; .ci/run does)' : e.message;
        clearTimeout(t);
        resolve(false);
      });
      proc.once('exit', () => {
        lastError ||= out.slice(-300);
        clearTimeout(t);
        resolve(false);
      });
    });
    if (ok) {
      // a test process that ends without its afterAll (a time-out) leaves no Redis behind
      const onExit = () => proc.kill('SIGKILL');
      process.once('exit', onExit);
      proc.once('exit', () => process.off('exit', onExit));
      const stop = async () => {
        if (proc.exitCode !== null || proc.signalCode !== null) return;
        const exited = new Promise((r) => proc.once('exit', r));
        proc.kill('SIGTERM');
        await exited;
      };
      return { url: `redis://127.0.0.1:${p}`, port: p, stop, proc };
    }
    proc.kill('SIGKILL');
    if (port !== undefined || /not installed/.test(lastError)) break;
  }
  throw new Error(`could not start redis-server: ${lastError}`);
}

/** The Redis CI started (PLATESMITH_TEST_REDIS), or one of this test file's own. */
export async function sharedRedis(): Promise<RedisServer> {
  const url = process.env['PLATESMITH_TEST_REDIS'];
  if (url) return { url, port: Number(new URL(url).port), stop: async () => {}, proc: null };
  return startRedis();
}

/** A key prefix of the test's own. */
export function testPrefix(): string {
  return `pst-${randomBytes(6).toString('hex')}`;
}
