/**
 * Browser test of the calculation record: Debian's chromium (driven by playwright-core) opens the
 * record of the bundled example girder, and the record printed to PDF by the shipped code path
 * (htmlToPdf: chromium --print-to-pdf) is read back with pdf.js. Asserted: the section headings,
 * the clause of every check, the caution once on every printed page (count = page count), and no
 * element wider than the printed page. PDF and screenshot: reports/record.pdf, reports/record.png.
 * No published source: this checks the document, not engineering values.
 */
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { htmlToPdf, renderRecord } from '@platesmith/report';
import { parseRecordRequest, publishRecord, type RecordData } from '@platesmith/schema';

const CHROMIUM = '/usr/bin/chromium';
const root = fileURLToPath(new URL('../../', import.meta.url));
const inCI = Boolean(process.env.CI);
const available = existsSync(CHROMIUM) || inCI;
const requireFromReport = createRequire(new URL('../../packages/report/package.json', import.meta.url));

interface El {
  tagName: string;
  getAttribute(n: string): string | null;
  querySelectorAll(q: string): ArrayLike<El> & Iterable<El>;
  getBoundingClientRect(): { left: number; right: number; width: number };
  scrollWidth: number;
  clientWidth: number;
  textContent: string | null;
}
interface Page {
  on(event: 'pageerror', cb: (e: Error) => void): void;
  goto(url: string): Promise<unknown>;
  setViewportSize(s: { width: number; height: number }): Promise<void>;
  emulateMedia(o: { media: 'print' | 'screen' }): Promise<void>;
  screenshot(o: { path: string; fullPage: boolean }): Promise<unknown>;
  evaluate<T>(fn: () => T): Promise<T>;
}
interface Browser {
  newPage(): Promise<Page>;
  close(): Promise<void>;
}

/** A4 less the record's 12 mm print margins each side, in CSS px (96 per inch). */
const PRINT_WIDTH_PX = Math.floor(((210 - 24) / 25.4) * 96);

function record(): RecordData {
  const input = JSON.parse(readFileSync(`${root}examples/check-demo.json`, 'utf8'));
  const r = parseRecordRequest({ ...input, title: { project: 'Harrowgate Mill (invented)', mark: 'G-07', revision: 'P01', preparedBy: 'A. Designer' } });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return publishRecord(r.value.check, r.value.raw, r.value.title);
}

describe.skipIf(!available)(available ? 'calculation record in chromium' : `calculation record in chromium — SKIPPED: ${CHROMIUM} is missing (run scripts/install-chromium.sh, or set CI to install it)`, () => {
  let browser: Browser;
  let page: Page;
  const errors: string[] = [];
  const data = record();
  const html = renderRecord(data);

  beforeAll(async () => {
    if (!existsSync(CHROMIUM) && inCI) execFileSync('bash', [`${root}scripts/install-chromium.sh`], { stdio: 'pipe', timeout: 540_000 });
    const { chromium } = requireFromReport('playwright-core') as { chromium: { launch(o: { executablePath: string; args: string[] }): Promise<Browser> } };
    mkdirSync(`${root}reports`, { recursive: true });
    writeFileSync(`${root}reports/record.html`, html);
    browser = await chromium.launch({ executablePath: CHROMIUM, args: ['--no-sandbox'] });
    page = await browser.newPage();
    page.on('pageerror', (e) => errors.push(e.message));
    await page.setViewportSize({ width: PRINT_WIDTH_PX, height: 1100 });
    await page.emulateMedia({ media: 'print' });
    await page.goto(pathToFileURL(`${root}reports/record.html`).href);
  }, 600_000);

  afterAll(async () => {
    await browser?.close();
  });

  test('the section headings, in order', async () => {
    const h2 = await page.evaluate(() => [...(globalThis as unknown as { document: El }).document.querySelectorAll('h2')].map((h) => h.textContent));
    expect(h2).toEqual(['1 Design basis', '2 Analysis', '3 Section', '4 Checks']);
  });

  test('every check in calculation order, each with its clause, and every drawing', async () => {
    const facts = await page.evaluate(() => {
      const d = (globalThis as unknown as { document: El }).document;
      return {
        checks: [...d.querySelectorAll('section.check h3')].map((h) => h.textContent ?? ''),
        charts: [...d.querySelectorAll('svg.chart')].map((s) => s.getAttribute('class')),
      };
    });
    expect(facts.checks).toHaveLength(data.verdict.checks.length);
    data.verdict.checks.forEach((c, i) => expect.soft(facts.checks[i], c.id).toContain(c.clause));
    expect(facts.charts).toEqual(['chart lines', 'chart lines', 'chart section', 'chart lines']);
  });

  test('no element wider than the printed page, and no table that scrolls', async () => {
    const over = await page.evaluate(() => {
      const d = (globalThis as unknown as { document: El & { documentElement: El } }).document;
      const w = d.documentElement.clientWidth;
      const out: string[] = [];
      for (const e of d.querySelectorAll('body *')) {
        const r = e.getBoundingClientRect();
        if (r.width > 0 && (r.right > w + 0.5 || r.left < -0.5)) out.push(`${e.tagName}.${e.getAttribute('class') ?? ''} ${Math.round(r.left)}–${Math.round(r.right)} of ${w}`);
        if (e.tagName === 'TABLE' && e.scrollWidth > e.clientWidth + 1) out.push(`table scrolls: ${e.scrollWidth} > ${e.clientWidth}`);
      }
      return out;
    });
    expect(over).toEqual([]);
    expect(errors).toEqual([]);
    await page.screenshot({ path: `${root}reports/record.png`, fullPage: true });
  });

  test('printed to PDF: the caution once on every page, text present', async () => {
    const pdf = await htmlToPdf(html, { timeoutMs: 300_000 });
    writeFileSync(`${root}reports/record.pdf`, pdf);
    const pdfjs = (await import('pdfjs-dist/legacy/build/pdf.mjs')) as unknown as {
      getDocument(o: { data: Uint8Array; useSystemFonts?: boolean; isEvalSupported?: boolean }): { promise: Promise<{ numPages: number; getPage(n: number): Promise<{ getTextContent(): Promise<{ items: { str?: string }[] }> }> }> };
    };
    const doc = await pdfjs.getDocument({ data: new Uint8Array(pdf), isEvalSupported: false }).promise;
    const pages: string[] = [];
    for (let i = 1; i <= doc.numPages; i++) pages.push((await (await doc.getPage(i)).getTextContent()).items.map((t) => t.str ?? '').join(' '));
    expect(doc.numPages).toBeGreaterThan(1);
    const cautions = pages.map((t) => t.split('Caution.').length - 1);
    expect(cautions).toEqual(pages.map(() => 1));
    const all = pages.join(' ');
    for (const s of ['Calculation record', 'Design basis', 'Not covered', 'Harrowgate Mill', 'G-07']) expect.soft(all).toContain(s);
    for (const c of data.verdict.checks) expect.soft(all.replace(/\s+/g, ' '), c.id).toContain(c.clause);
  }, 300_000);
});
