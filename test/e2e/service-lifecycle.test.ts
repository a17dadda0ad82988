/**
 * The service as a process (issue 16): SIGTERM while a long search runs exits within 10 s (a
 * liveness limit, not a speed target: the grace is 8 s, past it close-with-grace exits at once),
 * and every setting of the environment is read by name, refused when malformed, and documented
 * (README's team section and DEVELOPERS). No engineering value is asserted.
 */
import { spawn } from 'node:child_process';
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { expect, test } from 'vitest';
import { optionsFromEnv, SETTINGS } from '../../services/api/src/index.js';

const root = join(import.meta.dirname, '..', '..');

test('SIGTERM while a long search runs: the process exits within 10 s', async () => {
  const child = spawn(process.execPath, ['--conditions=@platesmith/source', '--import', 'tsx', 'services/cli/src/main.ts', 'serve'], {
    cwd: root,
    env: { ...process.env, PORT: '0', LOG_LEVEL: 'silent', PLATESMITH_DB: ':memory:', PLATESMITH_THREADS: '2' },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  try {
    const url = await new Promise<string>((resolve, reject) => {
      let err = '';
      child.stderr!.on('data', (d: Buffer) => {
        err += String(d);
        const m = /listening on (http:\/\/[\d.:]+)/.exec(err);
        if (m) resolve(m[1]!);
      });
      child.on('exit', (c) => reject(new Error(`the service exited (${c}) before listening: ${err}`)));
    });
    await fetch(`${url}/ready`);
    // a search of about 10^10 candidates with the greatest budget: it would run for minutes
    const search = fetch(`${url}/v1/searches?budgetMs=300000`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ spans: [24000], actions: [{ kind: 'permanent', load: 'udl', value: 10 }, { kind: 'variable', load: 'udl', value: 15, category: 'B' }], space: { symmetric: false } }),
    }).catch(() => null);
    // the request is in (the service answers /health meanwhile: the search is off the loop)
    expect((await fetch(`${url}/health`)).status).toBe(200);
    const t0 = performance.now();
    const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
    child.kill('SIGTERM');
    const code = await exited;
    const ms = performance.now() - t0;
    expect(ms).toBeLessThan(10_000);
    expect(code).not.toBeNull();
    await search;
  } finally {
    if (child.exitCode === null && child.signalCode === null) child.kill('SIGKILL');
  }
});

test('every setting is read by name, a malformed one is refused naming it', () => {
  expect(optionsFromEnv({})).toEqual({});
  expect(optionsFromEnv({ PLATESMITH_BUDGET_MS: '5000', PLATESMITH_ALLOWED_HOSTS: 'a.example, b.example:8080', PLATESMITH_MAX_CONNECTIONS: '10' })).toEqual({ defaultBudgetMs: 5000, allowedHosts: ['a.example', 'b.example:8080'], maxConnections: 10 });
  expect(() => optionsFromEnv({ PLATESMITH_BUDGET_MS: '0x1000' })).toThrow(/PLATESMITH_BUDGET_MS/);
  expect(() => optionsFromEnv({ PLATESMITH_THREADS: '0' })).toThrow(/PLATESMITH_THREADS/);
  expect(() => optionsFromEnv({ PLATESMITH_BUDGET_MS: '9000', PLATESMITH_MAX_BUDGET_MS: '5000' })).toThrow(/PLATESMITH_MAX_BUDGET_MS/);
});

test('every setting is in README (with its default) and DEVELOPERS', () => {
  const readme = readFileSync(join(root, 'README.md'), 'utf8');
  const dev = readFileSync(join(root, 'DEVELOPERS.md'), 'utf8');
  for (const s of SETTINGS) {
    expect.soft(readme, s.name).toMatch(new RegExp('`' + s.name + '`[^\\n]*\\|[^\\n]*\\|'));
    expect.soft(dev, s.name).toContain('`' + s.name + '`');
  }
});

test('every variable of the environment the code reads has a row with its default in README\'s "Running it for a team" table', () => {
  // the variables named in the service's and the CLI's sources (settings.ts, the server, the PDF printer, …)
  const sources = ['services/api/src', 'services/app/src', 'services/cli/src', 'packages/report/src', 'packages/schedule/src', 'packages/schema/src'];
  const names = new Set<string>(['HOST', 'PORT', 'LOG_LEVEL']);
  for (const dir of sources) {
    for (const f of readdirSync(join(root, dir), { recursive: true }) as string[]) {
      if (!f.endsWith('.ts')) continue;
      for (const m of readFileSync(join(root, dir, f), 'utf8').matchAll(/PLATESMITH_[A-Z_]+[A-Z]/g)) names.add(m[0]);
    }
  }
  const readme = readFileSync(join(root, 'README.md'), 'utf8');
  const team = readme.slice(readme.indexOf('## Running it for a team'), readme.indexOf('\n## ', readme.indexOf('## Running it for a team') + 3));
  const rows = team.split('\n').filter((l) => l.startsWith('| `'));
  for (const name of names) {
    const row = rows.find((l) => l.split('|')[1]!.includes('`' + name + '`'));
    expect.soft(row, `${name} has no row in the team section's table`).toBeDefined();
    // three cells: setting, what, default (non-empty)
    if (row) expect.soft(row.split('|')[3]!.trim(), `${name}'s default`).not.toBe('');
  }
  expect(names.size).toBeGreaterThan(SETTINGS.length);
});
