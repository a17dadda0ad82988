/**
 * Browser test of the HTML report: Debian's chromium driven by playwright-core opens a generated
 * report from a file:// URL, and we check that every chart rendered with its axes and marks and
 * that the page logged no error. Screenshot: reports/report.png.
 * No published source: this checks rendering, not engineering values.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
// test/ does not list these workspace packages yet: reached by path until it does
import { renderReport, type ReportInput } from '../../packages/report/src/index.js';
import { sampleReport } from '../../packages/report/test/fixture.js';
import { rationalise, tenderGirder, tonnage } from '../../packages/schedule/src/tender/index.js';

const CHROMIUM = '/usr/bin/chromium';
const root = fileURLToPath(new URL('../../', import.meta.url));
const inCI = Boolean(process.env.CI);
const available = existsSync(CHROMIUM) || inCI;

// playwright-core is a dependency of the report package; resolved from there
const requireFromReport = createRequire(new URL('../../packages/report/package.json', import.meta.url));

interface Page {
  on(event: 'console', cb: (m: { type(): string; text(): string }) => void): void;
  on(event: 'pageerror', cb: (e: Error) => void): void;
  goto(url: string): Promise<unknown>;
  setViewportSize(s: { width: number; height: number }): Promise<void>;
  screenshot(o: { path: string; fullPage: boolean }): Promise<unknown>;
  evaluate<T>(fn: () => T): Promise<T>;
}
interface Browser {
  newPage(): Promise<Page>;
  close(): Promise<void>;
}
interface Chromium {
  launch(o: { executablePath: string; args: string[] }): Promise<Browser>;
}

// the page's DOM, typed minimally (the project compiles without the DOM lib); each evaluated
// function reads `document` itself because it runs in the page, not here
interface El {
  getAttribute(n: string): string | null;
  querySelectorAll(q: string): ArrayLike<El> & Iterable<El>;
  querySelector(q: string): El | null;
  getBoundingClientRect(): { width: number; height: number };
  textContent: string | null;
}

async function reportInput(): Promise<ReportInput> {
  const base = sampleReport();
  const section = {
    web: { depth: 1400, thickness: 12 },
    topFlange: { width: 450, thickness: 30 },
    bottomFlange: { width: 450, thickness: 30 },
    stiffeners: { spacing: 2500, width: 120, thickness: 12, sides: 2 as const },
    endPost: 'rigid' as const,
    grade: 'S355',
  };
  const t = tonnage([tenderGirder('G1', 4, section, [0, 20000]), tenderGirder('G2 "end"', 2, { ...section, stiffeners: null }, [0, 10000])], { S355: 1.2 });
  const r = await rationalise({
    marks: [
      { mark: 'G1', quantity: 4, length: 20000 },
      { mark: 'G2 "end"', quantity: 2, length: 10000 },
    ],
    candidates: [
      { id: 'A', section, massPerMetre: 250 },
      { id: 'B', section, massPerMetre: 215 },
    ],
    feasible: [
      [true, false],
      [true, true],
    ],
  });
  // the tender outputs are passed as they are: their types fit the report's input
  return { ...base, tonnage: t, rationalisation: r };
}

describe.skipIf(!available)(available ? 'HTML report in chromium' : `HTML report in chromium — SKIPPED: ${CHROMIUM} is missing (run scripts/install-chromium.sh, or set CI to install it)`, () => {
  let browser: Browser;
  let page: Page;
  const errors: string[] = [];

  beforeAll(async () => {
    if (!existsSync(CHROMIUM) && inCI) execFileSync('bash', [`${root}scripts/install-chromium.sh`], { stdio: 'pipe', timeout: 540_000 });
    const { chromium } = requireFromReport('playwright-core') as { chromium: Chromium };
    mkdirSync(`${root}reports`, { recursive: true });
    const file = `${root}reports/report.html`;
    writeFileSync(file, renderReport(await reportInput()));
    browser = await chromium.launch({ executablePath: CHROMIUM, args: ['--no-sandbox'] });
    page = await browser.newPage();
    page.on('console', (m) => {
      if (m.type() === 'error') errors.push(m.text());
    });
    page.on('pageerror', (e) => errors.push(e.message));
    await page.setViewportSize({ width: 1200, height: 900 });
    await page.goto(pathToFileURL(file).href);
  }, 600_000);

  afterAll(async () => {
    await browser?.close();
  });

  test('every chart rendered with its axes and marks', async () => {
    const charts = await page.evaluate(() =>
      [...(globalThis as unknown as { document: El }).document.querySelectorAll('svg.chart')].map((s) => {
        const box = s.getBoundingClientRect();
        return {
          kind: s.getAttribute('class'),
          axes: s.querySelectorAll('g.axis').length,
          ticks: s.querySelectorAll('g.axis g.tick').length,
          labels: s.querySelectorAll('.axis-label').length,
          circles: s.querySelectorAll('circle').length,
          paths: s.querySelectorAll('path').length,
          rects: s.querySelectorAll('rect.bar').length,
          w: box.width,
          h: box.height,
        };
      }),
    );
    expect(charts.map((c) => c.kind)).toEqual(['chart pareto', 'chart utilisation', 'chart envelope', 'chart envelope', 'chart pareto']);
    for (const c of charts) {
      expect.soft(c.w, `${c.kind} width`).toBeGreaterThan(100);
      expect.soft(c.h, `${c.kind} height`).toBeGreaterThan(100);
      expect.soft(c.ticks, `${c.kind} ticks`).toBeGreaterThanOrEqual(3);
    }
    const [p1, u, m, v, p2] = charts;
    expect.soft([p1!.axes, p1!.labels, p1!.circles, p1!.paths]).toEqual([2, 2, 4, 1]);
    expect.soft([u!.axes, u!.rects]).toEqual([1, 3]);
    expect.soft([m!.axes, m!.circles, m!.paths]).toEqual([2, 41, 1]);
    expect.soft([v!.axes, v!.circles, v!.paths]).toEqual([2, 41, 1]);
    expect.soft([p2!.axes, p2!.circles]).toEqual([2, 2]);
  });

  test('caution in header and footer, tables present, no console error; screenshot saved', async () => {
    const facts = await page.evaluate(() => {
      const d = (globalThis as unknown as { document: El }).document;
      return {
      header: d.querySelector('header.page .caution')?.textContent ?? '',
      footer: d.querySelector('footer.page .caution')?.textContent ?? '',
      tables: [...d.querySelectorAll('table caption')].map((c) => c.textContent),
      };
    });
    expect.soft(facts.header).toMatch(/design aid/);
    expect.soft(facts.footer).toMatch(/design aid/);
    expect.soft(facts.tables).toEqual(expect.arrayContaining(['Tonnage by mark', 'Tonnage by grade', 'Tonnage by thickness', 'Plate list', 'At most K distinct sections (mass)']));
    await page.screenshot({ path: `${root}reports/report.png`, fullPage: true });
    expect(existsSync(`${root}reports/report.png`)).toBe(true);
    expect(errors).toEqual([]);
  });
});
