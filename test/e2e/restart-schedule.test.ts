/**
 * Restart of the service in the middle of a schedule job (SQLite job store on a file): the
 * service runs as a child process (node with the tsx loader and the source condition, as the
 * CLI runs), a schedule is submitted, the test polls the API until at least one mark is
 * finished and not all, SIGKILLs the process, starts it again on the same database file, and
 * checks that every mark finished before the kill is returned exactly as it was stored (byte
 * for byte, so it was not run again) and that the rest completes.
 *
 * Behaviour test of the job store and the restart rule; no engineering value is asserted.
 * Loopback only; every wait is bounded; the test kills the processes it started.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, expect, test } from 'vitest';

const root = join(dirname(fileURLToPath(import.meta.url)), '..', '..');
const serverUrl = pathToFileURL(join(root, 'services', 'api', 'src', 'server.ts')).href;
const sqliteUrl = pathToFileURL(join(root, 'services', 'api', 'src', 'jobs', 'sqlite.ts')).href;

// the child: the real server (startServer) on 127.0.0.1:0 with the SQLite store on $DB
const CHILD = `
const { startServer } = await import(${JSON.stringify(serverUrl)});
const { SqliteJobStore } = await import(${JSON.stringify(sqliteUrl)});
const jobStore = new SqliteJobStore({ path: process.env.DB });
const s = await startServer({ host: '127.0.0.1', port: 0, threads: 2, logger: false, jobStore });
process.stdout.write('LISTENING ' + s.url + '\\n');
`;

const dir = mkdtempSync(join(tmpdir(), 'platesmith-restart-'));
const db = join(dir, 'jobs.sqlite');
const children = new Set<ChildProcess>();

afterAll(() => {
  for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
  rmSync(dir, { recursive: true, force: true });
});

/** Starts the service; resolves with its URL once it listens (bounded). */
function startChild(): Promise<{ child: ChildProcess; url: string }> {
  const child = spawn(process.execPath, ['--conditions=@platesmith/source', '--import', 'tsx', '--input-type=module', '-e', CHILD], {
    cwd: root,
    env: { ...process.env, DB: db, LOG_LEVEL: 'silent', PLATESMITH_RATE_LIMIT: 'off' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.add(child);
  return new Promise((resolve, reject) => {
    let out = '';
    let err = '';
    const timer = setTimeout(() => reject(new Error(`the service did not start in 30 s: ${err}`)), 30_000);
    child.stdout!.on('data', (d: Buffer) => {
      out += String(d);
      const m = /LISTENING (\S+)/.exec(out);
      if (m) {
        clearTimeout(timer);
        resolve({ child, url: m[1]! });
      }
    });
    child.stderr!.on('data', (d: Buffer) => (err += String(d)));
    child.on('exit', (code, sig) => {
      clearTimeout(timer);
      reject(new Error(`the service exited (${code ?? sig}) before listening: ${err}`));
    });
  });
}

function killed(child: ChildProcess): Promise<void> {
  return new Promise((resolve) => {
    if (child.exitCode !== null || child.signalCode !== null) return resolve();
    child.once('exit', () => resolve());
    child.kill('SIGKILL');
  });
}

const json = async (r: Response) => ({ status: r.status, body: (await r.json()) as any });

/** Polls GET url until `done(body)` holds; at most `tries` times, `everyMs` apart. */
async function poll(url: string, done: (b: any) => boolean, tries: number, everyMs: number): Promise<any> {
  for (let i = 0; i < tries; i++) {
    const r = await json(await fetch(url));
    if (r.status === 200 && done(r.body)) return r.body;
    await new Promise((res) => setTimeout(res, everyMs));
  }
  throw new Error(`${url}: condition not met after ${tries} polls`);
}

// three marks on the default space (a few seconds each on two threads): a wide window in which
// one mark is finished and the others are not
const ACTIONS = [
  { kind: 'permanent', load: 'udl', value: 10 },
  { kind: 'variable', load: 'udl', value: 15, category: 'B' },
];
const SCHEDULE = {
  name: 'restart',
  defaults: { actions: ACTIONS },
  girders: [
    { mark: 'R1', quantity: 2, spans: [24000] },
    { mark: 'R2', quantity: 1, spans: [22000] },
    { mark: 'R3', quantity: 3, spans: [20000] },
  ],
};

test('SIGKILL mid-job: finished marks are kept as stored, the rest runs after the restart', async () => {
  const first = await startChild();
  const sub = await json(await fetch(`${first.url}/v1/schedules`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(SCHEDULE) }));
  expect(sub.status).toBe(202);
  const id = sub.body.id as string;

  // poll every 50 ms for at most 60 s until a mark is done (and not all)
  const mid = await poll(`${first.url}/v1/schedules/${id}`, (b) => (b.progress?.marksDone ?? 0) >= 1, 1200, 50);
  expect(mid.status, 'the job finished before the test could kill it: make the marks slower').toBe('running');
  const before = await json(await fetch(`${first.url}/v1/schedules/${id}/marks`));
  await killed(first.child);
  expect(first.child.signalCode).toBe('SIGKILL');

  const kept = before.body.marks as { mark: string }[];
  expect(kept.length).toBeGreaterThanOrEqual(1);
  expect(kept.length).toBeLessThan(3);
  expect(kept.map((m) => m.mark)).toEqual(['R1', 'R2', 'R3'].slice(0, kept.length));

  const second = await startChild();
  // after the restart the job is taken up again (resumed once) and completes
  const done = await poll(`${second.url}/v1/schedules/${id}`, (b) => b.status === 'done' || b.status === 'failed' || b.status === 'cancelled', 1200, 50);
  expect(done).toMatchObject({ id, status: 'done', resumed: 1, progress: { marksDone: 3, marksTotal: 3 } });

  const res = await json(await fetch(`${second.url}/v1/schedules/${id}/result`));
  expect(res.status).toBe(200);
  expect(res.body.marks.map((m: { mark: string; status: string }) => [m.mark, m.status])).toEqual([
    ['R1', 'ok'],
    ['R2', 'ok'],
    ['R3', 'ok'],
  ]);
  // each mark finished before the kill is the stored one, unchanged (a re-run would differ at
  // least in its wall time)
  for (const [i, m] of kept.entries()) expect(JSON.stringify(res.body.marks[i])).toBe(JSON.stringify(m));
  expect(res.body.records).toHaveLength(3);

  // the job is listed, and deleting it removes it and its marks from the file
  const del = await fetch(`${second.url}/v1/schedules/${id}`, { method: 'DELETE' });
  expect(del.status).toBe(204);
  expect((await fetch(`${second.url}/v1/schedules/${id}/marks`)).status).toBe(404);
  await killed(second.child);
}, 180_000);
