/**
 * Report rendering (this project's own layout; no published source — structure and escaping
 * checks, plus axis ticks against d3-scale's documented "nice" 1-2-5 tick rule).
 */
import { describe, expect, test } from 'vitest';
import { CAUTION } from '@platesmith/schema';
import { envelopeChart, esc, paretoChart, renderReport, utilisationChart, markFromSearch } from '../src/index.js';
import { sampleReport } from './fixture.js';

const count = (s: string, re: RegExp) => (s.match(re) ?? []).length;

describe('renderReport', () => {
  const html = renderReport(sampleReport());
  test('caution in the header and the footer', () => {
    const header = html.slice(html.indexOf('<header'), html.indexOf('</header>'));
    const footer = html.slice(html.indexOf('<footer'), html.indexOf('</footer>'));
    expect.soft(header).toContain(esc(CAUTION));
    expect.soft(footer).toContain(esc(CAUTION));
  });
  test('self-contained: no external resource, no script', () => {
    expect.soft(html).not.toMatch(/<script|<link|src="http|href="http|@import|url\(/i);
    expect.soft(count(html, /https?:\/\//g)).toBe(count(html, /xmlns="http:\/\/www\.w3\.org\/2000\/svg"/g));
  });
  test('text is escaped', () => {
    expect.soft(html).toContain('Schedule &lt;A&amp;B&gt; report');
    expect.soft(html).toContain('G2 &quot;end&quot;');
    expect.soft(html).not.toContain('<A&B>');
  });
  test('one Pareto chart per mark, one utilisation chart and two envelope charts for G1', () => {
    expect.soft(count(html, /class="chart pareto"/g)).toBe(2);
    expect.soft(count(html, /class="chart utilisation"/g)).toBe(1);
    expect.soft(count(html, /class="chart envelope"/g)).toBe(2);
    expect.soft(count(html, /<circle class="point/g)).toBe(6);
    expect.soft(count(html, /class="bar fail"/g)).toBe(1);
    expect.soft(html).toContain('print');
    expect.soft(html).toContain('Plate list');
    expect.soft(html).toContain('no choice of 1 section fits every mark');
  });
});

test('Pareto axes: nice 1-2-5 ticks over the padded data extent', () => {
  const svg = paretoChart([{ depth: 1000, mass: 2000 }, { depth: 2000, mass: 1500 }], { title: 't' });
  const xt = [...svg.matchAll(/<g class="tick" transform="translate\([\d.]+,0\)"><line y2="5"\/><text y="18" text-anchor="middle">([^<]+)</g)].map((m) => m[1]);
  // domain [940, 2060] niced to [900, 2100] with step 200 (d3-scale ticks)
  expect(xt).toEqual(['1000', '1200', '1400', '1600', '1800', '2000']);
  expect(count(svg, /class="axis x-axis"/g) + count(svg, /class="axis y-axis"/g)).toBe(2);
  // step after each point: horizontal to the next depth, then vertical to its mass
  expect(svg).toContain('<path class="step" d="M107.667,35.667L464.333,35.667L464.333,232.333"/>');
});

test('empty inputs draw a labelled empty chart, not a crash', () => {
  expect(paretoChart([], { title: 'x' })).toContain('no feasible section');
  expect(utilisationChart([{ id: 'a', utilisation: null, passes: true }], { title: 'x' })).toContain('no utilisations');
  expect(envelopeChart([], [], [], { title: 'x', yLabel: 'y', symmetric: true })).toContain('no stations');
});

test('markFromSearch: worst station per check, most utilised first', () => {
  const c = (id: string, u: number | null, applies = true) => ({ id, clause: '', applies, utilisation: u, passes: (u ?? 0) <= 1, at: 0, values: {}, units: {} });
  const point = { depth: 1500, mass: 5000, massPerMetre: 250, value: 5000, section: {} as never, governing: c('bending', 0.9), checks: [c('bending', 0.9), c('shear', 0.5), c('shear', 0.7), c('patch-loading', null, false)] };
  const m = markFromSearch('G', 3, { status: 'exact', message: '', objective: 'mass', pareto: [point], lightest: point, nearMisses: [], stats: {} as never, assumptions: [], caution: '', scope: '' });
  expect(m.utilisation).toEqual({ of: 'lightest', passes: true, checks: [{ id: 'bending', clause: '', utilisation: 0.9, passes: true }, { id: 'shear', clause: '', utilisation: 0.7, passes: true }] });
  expect(m.pareto).toEqual([{ depth: 1500, mass: 5000, governing: 'bending' }]);
});
