/**
 * What a tender estimator reads from a schedule (#19), on the bundled harbour-sheds schedule: one
 * tonnage that reconciles (counted = lightest + saving, per mark and in total, bearing stiffeners
 * in every figure), the saving of the lightest against the adopted section, the cost with its
 * currency, sections in words (never an internal key), the plate list as CSV whose masses add up
 * to the tonnage, and the moment and shear diagrams drawn for each mark. The one engineering
 * fact asserted is arithmetic: a sum of the parts equals the total.
 */
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { main } from '../../services/cli/src/main.js';

const dir = mkdtempSync(join(tmpdir(), 'platesmith-estimator-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));
const f = (name: string) => join(dir, name);
const root = new URL('../../', import.meta.url).pathname;

let r: any;
let out = '';
beforeAll(async () => {
  let json = '';
  const code = await main(['schedule', `${root}demo/schedule-harbour-sheds.json`, '--rationalise', '2', '--report', f('r.html'), '--plates', f('plates.csv'), '--markdown', f('r.md'), '--out', f('r.json'), '--quiet', '--threads', '2'], {
    out: (s) => (out += s + '\n'),
    err: () => {},
  });
  json = readFileSync(f('r.json'), 'utf8');
  r = JSON.parse(json);
  expect(code).toBe(0);
}, 300_000);

test('one tonnage that reconciles: counted = lightest + saving, per mark and in total', () => {
  const rec = r.tender.reconciliation;
  const t = r.tender.tonnage;
  expect(rec.used).toBeCloseTo(t.total, 2);
  expect(rec.used).toBeCloseTo(rec.lightest + rec.saving, 2);
  expect(rec.lightest / 1000).toBeCloseTo(r.totals.tonnage, 2);
  for (const m of rec.byMark) {
    if (m.section === 'lightest') expect(m.saving).toBe(0);
    else expect(m.saving).toBeCloseTo((m.perGirder - m.lightestPerGirder) * m.quantity, 2);
  }
  // no binary round-off in the published masses
  expect(JSON.stringify(t)).not.toMatch(/\d\.\d{4,}/);
});

test('cost with its currency; the text, Markdown and report say the reconciliation', () => {
  expect(r.tender.currency).toBe('EUR');
  expect(out).toMatch(/material cost [\d.]+ EUR/);
  expect(out).toMatch(/= [\d.]+ t on the lightest sections \+ [\d.]+ t that adopting the lightest would save/);
  expect(readFileSync(f('r.md'), 'utf8')).toMatch(/material cost [\d.]+ EUR/);
  const html = readFileSync(f('r.html'), 'utf8');
  expect(html).toContain('cost (EUR)');
  expect(html).toContain('Saving of the lightest section against the section counted');
});

test('sections in words, never an internal key; the diagrams of every mark drawn', () => {
  const html = readFileSync(f('r.html'), 'utf8');
  expect(html).not.toMatch(/\d+x\d+\|\d+x\d+/);
  expect(html).toContain('Adopted section:</strong> web 1000 × 12, flanges 350 × 25');
  expect((html.match(/Lightest section:<\/strong> web /g) ?? []).length).toBe(3);
  expect((html.match(/class="chart envelope"/g) ?? []).length).toBe(2 * r.marks.length);
  expect(html).toContain('Design moment envelope against the moment resistances');
});

test('the plate list as CSV: one row per line of the list, masses adding up to the tonnage', () => {
  const csv = readFileSync(f('plates.csv'), 'utf8').trimEnd().split('\r\n');
  expect(csv[0]).toBe('product,grade,thickness_mm,width_mm,length_mm,count,unit_mass_kg,mass_kg,marks,parts');
  expect(csv.length - 1).toBe(r.tender.tonnage.plates.length);
  const sum = csv.slice(1).reduce((a, l) => a + Number(l.split(',')[7]), 0);
  expect(sum).toBeCloseTo(r.tender.tonnage.total, 0);
});
