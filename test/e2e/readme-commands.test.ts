/**
 * Every command the README shows works as written (#19): the commands are read from the README's
 * `sh` blocks themselves and run from the repository root with bash, on the bundled files. Left
 * out, and said here: set-up (`npm i -g pnpm@10`, `pnpm install`: CI has just done them), the
 * test command itself (`pnpm test`: this suite), and the server and queue commands (`curl …`
 * against `platesmith serve`, and the team set-up that writes a keys file for it; the API's routes
 * have their own end-to-end tests). The README's
 * JSON examples are parsed by the schemas they illustrate. Behaviour tests; no engineering value.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, test } from 'vitest';
import { effectsOf } from '@platesmith/app';
import { parseWith, ProblemJson, SectionJson, SpaceJson } from '@platesmith/schema';

const root = fileURLToPath(new URL('../../', import.meta.url));
const readme = readFileSync(`${root}README.md`, 'utf8');

/** The fenced blocks of one info string, in order. */
function blocks(lang: string): string[] {
  const re = new RegExp('^```' + lang + '\\n([\\s\\S]*?)^```', 'gm');
  return [...readme.matchAll(re)].map((m) => m[1]!);
}

/** Commands of the sh blocks: continuation lines joined, comments cut, `a && b` split. */
export function readmeCommands(): string[] {
  const out: string[] = [];
  for (const b of blocks('sh')) {
    const lines = b.replace(/\\\n\s*/g, ' ').split('\n');
    for (const l of lines) {
      const code = l.replace(/\s+#\s.*$/, '').trim();
      if (code) out.push(...code.split(/\s*&&\s*/).map((c) => c.trim()));
    }
  }
  return out;
}

const SKIP: { re: RegExp; why: string }[] = [
  { re: /^npm i -g pnpm@/, why: 'set-up' },
  { re: /^pnpm install$/, why: 'set-up' },
  { re: /^pnpm test$/, why: 'this suite' },
  { re: /^curl /, why: 'server' },
  { re: /^pnpm platesmith (serve|worker)\b/, why: 'server or queue' },
  // the queue backend's three commands: Redis, the API and a worker, each running until stopped (queue-backend.test.ts runs them in-process)
  { re: /^redis-server /, why: 'queue' },
  { re: /^PLATESMITH_QUEUE=\S+ pnpm platesmith (serve|worker)$/, why: 'server or queue' },
  // running it for a team: a keys file written, then the server with it (its routes have their own tests)
  { re: /^printf .* > keys\.txt$/, why: 'team set-up' },
  { re: /^HOST=\S+ PLATESMITH_API_KEYS_FILE=keys\.txt pnpm platesmith serve$/, why: 'server' },
];

const commands = readmeCommands();
const runnable = commands.filter((c) => !SKIP.some((s) => s.re.test(c)));

test('the README shows the commands this test expects to find (the extraction works)', () => {
  expect(runnable).toEqual(
    expect.arrayContaining([
      'pnpm demo',
      'pnpm platesmith check examples/check-demo.json',
      expect.stringMatching(/^pnpm platesmith effects /),
      expect.stringMatching(/^pnpm platesmith search /),
      expect.stringMatching(/^pnpm platesmith record .*--out reports\//),
      'pnpm platesmith schedule demo/schedule-harbour-sheds.json --report reports/harbour.html',
    ]),
  );
  // nothing left out that is not set-up, this suite, the server or the queue
  expect(commands.filter((c) => SKIP.some((s) => s.re.test(c))).every((c) => /^(npm i -g|pnpm install|pnpm test|curl |pnpm platesmith serve|printf |HOST=|redis-server |PLATESMITH_QUEUE=)/.test(c))).toBe(true);
});

describe('each README command exits 0 from the repository root', () => {
  test.each(runnable)('%s', (cmd) => {
    const r = spawnSync('bash', ['-c', cmd], { cwd: root, encoding: 'utf8', timeout: 540_000, env: { ...process.env, NO_COLOR: '1' } });
    const said = `${r.stdout}\n${r.stderr}`;
    expect(said).not.toMatch(/internal error|Error: |at .*\.ts:\d+/);
    expect(r.status, `${cmd}\n${r.stderr.slice(-2000)}`).toBe(0);
    // every human-facing output carries the caution (the record carries it in the file)
    if (!/ record /.test(cmd)) expect(said).toContain('design aid');
  }, 600_000);
});

test("the README's JSON examples are accepted by the schemas they illustrate", () => {
  const json = blocks('json');
  const objects = json.map((b) => {
    try {
      return JSON.parse(b) as Record<string, unknown>;
    } catch {
      return {}; // a fragment ("space": { … }), read below
    }
  });
  const problem = objects.find((o) => o.spans && o.actions);
  const p = parseWith(ProblemJson, problem);
  expect(p.ok, JSON.stringify(p)).toBe(true);
  if (p.ok) expect(effectsOf(p.value).envelope.MEdMax).toBeGreaterThan(0);
  const section = objects.find((o) => o.web && o.topFlange);
  expect(parseWith(SectionJson, section).ok).toBe(true);
  const space = json.map((b) => b.trim()).find((b) => b.startsWith('"space"'))!;
  expect(parseWith(SpaceJson, JSON.parse(`{${space}}`).space).ok).toBe(true);
});
