/**
 * Regression test of issue 16's "SIGTERM does nothing (only SIGKILL)": the real server in a child
 * process (as `platesmith serve` runs it, SQLite job store on a file) is given two schedule jobs
 * and eight synchronous searches of the default space, each several seconds of work, and is sent
 * SIGTERM while they run. It must exit by itself, cleanly (code 0), within 10 s: a liveness bound
 * (close-with-grace's delay), not a speed target. Then a restart on the same file finds both
 * jobs queued again (a shutdown puts running jobs back). And SIGHUP re-reads the keys file without
 * stopping the service (close-with-grace would close on it). Loopback only; the test kills what it
 * started; the keys are invented.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, expect, test } from 'vitest';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const serverUrl = pathToFileURL(join(root, 'services', 'api', 'src', 'server.ts')).href;
const CHILD = `
const { startServer } = await import(${JSON.stringify(serverUrl)});
const s = await startServer({ host: '127.0.0.1', port: 0, threads: 2, logger: { level: 'error' } });
process.stdout.write('LISTENING ' + s.url + '\\n');
`;

const dir = mkdtempSync(join(tmpdir(), 'platesmith-sigterm-'));
const children = new Set<ChildProcess>();
afterAll(() => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  rmSync(dir, { recursive: true, force: true });
});

function startChild(extra: Record<string, string> = {}): Promise<{ child: ChildProcess; url: string; exited: Promise<number | null> }> {
  const child = spawn(process.execPath, ['--conditions=@platesmith/source', '--import', 'tsx', '--input-type=module', '-e', CHILD], {
    cwd: root,
    env: { ...process.env, PLATESMITH_DB: join(dir, 'jobs.sqlite'), LOG_LEVEL: 'error', PLATESMITH_RATE_LIMIT: 'off', ...extra },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(child);
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  return new Promise((resolve, reject) => {
    let out = '';
    let err = '';
    const timer = setTimeout(() => reject(new Error(`the service did not start in 30 s: ${err}`)), 30_000);
    child.stdout!.on('data', (d: Buffer) => {
      out += String(d);
      const m = /LISTENING (\S+)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve({ child, url: m[1]!, exited });
      }
    });
    child.stderr!.on('data', (d: Buffer) => (err += String(d)));
    void exited.then((code) => {
      clearTimeout(timer);
      // its error lines (pino on stdout) say why
      reject(new Error(`the service exited (${code}) before listening: ${err} ${out.slice(-2000)}`));
    });
  });
}

const ACTIONS = [
  { kind: 'permanent', load: 'udl', value: 10 },
  { kind: 'variable', load: 'udl', value: 15, category: 'B' },
];
const SCHEDULE = { defaults: { actions: ACTIONS }, girders: [24000, 22000, 20000, 26000].map((s, i) => ({ mark: `S${i + 1}`, quantity: 1, spans: [s] })) };
const post = (url: string, body: unknown) => fetch(url, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) });

test('SIGTERM under load: the service exits by itself within 10 s (liveness bound), and its jobs are queued again for the next start', async () => {
  const first = await startChild();
  const ids: string[] = [];
  for (let i = 0; i < 2; i++) {
    const r = await post(`${first.url}/v1/schedules`, SCHEDULE);
    expect(r.status).toBe(202);
    ids.push(((await r.json()) as { id: string }).id);
  }
  // eight searches in flight (answers not awaited: the shutdown may cut them)
  const searches = Array.from({ length: 8 }, (_, i) => post(`${first.url}/v1/searches?budgetMs=120000`, { spans: [20000 + 1000 * i], actions: ACTIONS }).then((r) => r.status, () => 0));
  // the first job is running (its marks take seconds each): poll its status, bounded
  for (let i = 0; i < 600; i++) {
    const s = (await (await fetch(`${first.url}/v1/schedules/${ids[0]}`)).json()) as { status: string };
    if (s.status === 'running') break;
    await new Promise((r) => setTimeout(r, 50));
  }
  first.child.kill('SIGTERM');
  const code = await Promise.race([first.exited, new Promise<'still running'>((r) => setTimeout(() => r('still running'), 10_000).unref())]);
  expect(code, 'the service did not exit within 10 s of SIGTERM').toBe(0);
  // every search got an answer or had its connection closed (none hangs)
  for (const s of await Promise.all(searches)) expect([0, 200, 503]).toContain(s);

  const second = await startChild();
  for (const id of ids) {
    const s = (await (await fetch(`${second.url}/v1/schedules/${id}`)).json()) as { status: string };
    expect(['queued', 'running']).toContain(s.status);
    await fetch(`${second.url}/v1/schedules/${id}`, { method: 'DELETE' });
  }
  second.child.kill('SIGKILL');
  await second.exited;
}, 120_000);

test('SIGHUP re-reads the keys file; the service keeps running', async () => {
  const file = join(dir, 'keys.txt');
  const A = 'alice:0123456789abcdef0123456789abcdef';
  const B = 'bob:fedcba9876543210fedcba9876543210';
  writeFileSync(file, `${A}\n`);
  const s = await startChild({ PLATESMITH_API_KEYS_FILE: file, PLATESMITH_DB: join(dir, 'hup.sqlite') });
  const as = async (line: string) => (await fetch(`${s.url}/v1/schedules`, { headers: { authorization: `Bearer ${line.split(':')[1]}` } })).status;
  expect(await as(A)).toBe(200);
  expect(await as(B)).toBe(401);
  writeFileSync(file, `${B}\n`);
  s.child.kill('SIGHUP');
  // bounded: the reload happens when the signal is handled
  let status = 0;
  for (let i = 0; i < 100 && status !== 200; i++) {
    status = await as(B);
    if (status !== 200) await new Promise((r) => setTimeout(r, 50));
  }
  expect(status).toBe(200);
  expect(await as(A)).toBe(401);
  expect(s.child.exitCode).toBeNull();
  s.child.kill('SIGKILL');
  await s.exited;
}, 60_000);
