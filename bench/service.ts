/**
 * `pnpm bench:service`: the HTTP service under load (issue 16). Figures only, never asserted.
 * The service runs in a child process (from TypeScript source, as `pnpm platesmith serve` does);
 * autocannon drives it from this process over loopback.
 *  1. 64 connections for 30 s on POST /v1/checks (examples/check-demo.json), then on GET /health:
 *     requests per second, p99 latency, errors and non-2xx answers, the service's RSS before and after.
 *  2. Event-loop lag while a worst-case legal request runs: a check of 20 spans of 20 m with 400
 *     grid divisions and 7 variable actions (about 1.6·10^7 units of analysis work, just under the
 *     cap of 2·10^7), then the calculation record of the same girder, then the demo schedule with
 *     its rationalisation (marks and finish), with /health sampled every 20 ms meanwhile: its
 *     latencies show whether the loop was held (it should not be: the analysis, the record and the
 *     finish run on worker threads).
 * The rate limit is off in the child (one address sends tens of thousands of requests a minute
 * here; with it on, the answers past 1200 a minute are 429s and the figures measure the limiter).
 * The machine reference (bench/machine.ts) is printed first: figures compare only beside it.
 * `--seconds=N` shortens the load phases; `--json` prints one JSON line per figure.
 */
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import autocannon from 'autocannon';
import { machineLine, machineReference } from './machine.js';

const json = process.argv.includes('--json');
const seconds = Number(process.argv.find((a) => a.startsWith('--seconds='))?.slice(10) ?? 30);
const root = new URL('..', import.meta.url);

const machine = await machineReference();
if (json) process.stdout.write(JSON.stringify({ name: 'machine reference', ...machine }) + '\n');
else process.stdout.write(machineLine(machine) + '\n');

function rssMb(pid: number): number {
  const m = /VmRSS:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
  return m ? Math.round(Number(m[1]) / 1024) : Number.NaN;
}

const child = spawn(process.execPath, ['--conditions=@platesmith/source', '--import', 'tsx', 'services/cli/src/main.ts', 'serve'], {
  cwd: root,
  env: { ...process.env, PORT: '0', LOG_LEVEL: 'warn', PLATESMITH_DB: ':memory:', PLATESMITH_MAX_ACTIVE: '256', PLATESMITH_RATE_LIMIT: 'off' },
  stdio: ['ignore', 'ignore', 'pipe'],
});
const url = await new Promise<string>((resolve, reject) => {
  let out = '';
  child.stderr.on('data', (d) => {
    out += String(d);
    const m = /listening on (http:\/\/[\d.:]+)/.exec(out);
    if (m) resolve(m[1]!);
  });
  child.on('exit', (c) => reject(new Error(`the service exited (${c}) before listening`)));
});
// the first requests of a fresh pool compile the workers: warm up before measuring
await fetch(`${url}/ready`);

const report = (name: string, f: Record<string, unknown>) => {
  if (json) process.stdout.write(JSON.stringify({ name, ...f }) + '\n');
  else process.stdout.write(`${name}: ${Object.entries(f).map(([k, v]) => `${k} ${v}`).join(', ')}\n`);
};

const check = readFileSync(new URL('examples/check-demo.json', root), 'utf8');
for (const [name, opts] of [
  ['POST /v1/checks', { method: 'POST' as const, path: '/v1/checks', body: check, headers: { 'content-type': 'application/json' } }],
  ['GET /health', { method: 'GET' as const, path: '/health' }],
] as const) {
  // the path in the url: autocannon's own `path` beside a url gave '//health', a 404 every time
  const { path, ...rest } = opts;
  await autocannon({ url: url + path, connections: 8, duration: 2, ...rest }); // warm-up
  const before = rssMb(child.pid!);
  const r = await autocannon({ url: url + path, connections: 64, duration: seconds, ...rest });
  report(name, { 'req/s': Math.round(r.requests.average), 'p99 ms': r.latency.p99, errors: r.errors, timeouts: r.timeouts, non2xx: r.non2xx, 'RSS before MB': before, 'RSS after MB': rssMb(child.pid!) });
}

// event-loop lag while a worst-case legal request runs
const worst = {
  spans: Array(20).fill(20000),
  gridDivisions: 400,
  actions: [{ kind: 'permanent', load: 'udl', value: 20 }, ...Array.from({ length: 7 }, (_, i) => ({ kind: 'variable', load: 'udl', value: 5 + i, category: 'B' }))],
  section: JSON.parse(check).section,
  options: { restraint: { spacing: 4000 } },
};
/** /health sampled every 20 ms until `work` settles: the latencies say whether the loop was held. */
async function lagWhile<T>(work: Promise<T>): Promise<{ value: T; ms: number; lags: number[] }> {
  const t0 = performance.now();
  let running = true;
  const done = work.finally(() => (running = false));
  const lags: number[] = [];
  while (running) {
    const s = performance.now();
    await fetch(`${url}/health`);
    lags.push(performance.now() - s);
    await new Promise((r) => setTimeout(r, 20));
  }
  const value = await done;
  lags.sort((a, b) => a - b);
  return { value, ms: performance.now() - t0, lags };
}
const lagFigures = (lags: number[]) => ({
  '/health samples': lags.length,
  '/health median ms': lags.length ? Math.round(lags[lags.length >> 1]! * 10) / 10 : NaN,
  '/health max ms': lags.length ? Math.round(lags[lags.length - 1]! * 10) / 10 : NaN,
});
const post = (path: string, body: unknown) =>
  fetch(`${url}${path}`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(body) }).then(async (r) => ({ status: r.status, bytes: (await r.text()).length }));

for (const [name, path] of [
  ['worst-case legal check', '/v1/checks?budgetMs=300000'],
  ['its calculation record', '/v1/records?budgetMs=300000'],
] as const) {
  const w = await lagWhile(post(path, worst));
  report(name, { status: w.value.status, 'wall ms': Math.round(w.ms), 'answer kB': Math.round(w.value.bytes / 1024), ...lagFigures(w.lags) });
}

// the demo schedule (invented) with its rationalisation to 3 sections: marks on the pool, then the finish
const demo = JSON.parse(readFileSync(new URL('demo/schedule-harbour-sheds.json', root), 'utf8'));
const schedule = { ...demo, tender: { ...demo.tender, rationalise: 3 } };
const job = await lagWhile(
  (async () => {
    const sub = (await (await fetch(`${url}/v1/schedules`, { method: 'POST', headers: { 'content-type': 'application/json' }, body: JSON.stringify(schedule) })).json()) as { id: string };
    for (;;) {
      const st = (await (await fetch(`${url}/v1/schedules/${sub.id}`)).json()) as { status: string; marks: number };
      if (['done', 'failed', 'cancelled'].includes(st.status)) return st;
      await new Promise((r) => setTimeout(r, 100));
    }
  })(),
);
report('demo schedule with rationalisation', { status: job.value.status, marks: job.value.marks, 'wall ms': Math.round(job.ms), ...lagFigures(job.lags) });

child.kill('SIGTERM');
await new Promise((r) => child.once('exit', r));
