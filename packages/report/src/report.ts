import { CAUTION, SCOPE, type PublishedSearch, type PublishedVerdict } from '@platesmith/schema';
import { envelopeChart, paretoChart, utilisationChart } from './charts.js';
import { esc } from './html.js';
import type { ReportCoverage, ReportInput, ReportMark, ReportRationalisation, ReportReconciliation, ReportTonnage } from './types.js';
import { sectionKeyInWords } from './words.js';

const STYLE = `
:root { --ink:#1b1f24; --muted:#5b6570; --rule:#c9d0d6; --accent:#1f5f8b; --ok:#2e7d4f; --bad:#b3261e; }
* { box-sizing: border-box; }
body { font: 14px/1.45 system-ui, "Segoe UI", Roboto, Helvetica, Arial, sans-serif; color: var(--ink); margin: 0; }
header.page, footer.page { padding: 8px 24px; background: #f3f5f7; border-bottom: 1px solid var(--rule); }
footer.page { border-top: 1px solid var(--rule); border-bottom: 0; margin-top: 32px; }
header.page h1 { margin: 0; font-size: 20px; }
.caution { font-size: 12px; color: var(--muted); margin: 4px 0 0; }
.caution strong { color: var(--bad); }
main { padding: 0 24px; }
section.mark { border-top: 2px solid var(--accent); margin-top: 24px; padding-top: 8px; break-inside: avoid-page; }
.charts { display: flex; flex-wrap: wrap; gap: 16px; }
figure { margin: 0; }
figcaption { font-size: 12px; color: var(--muted); }
table { border-collapse: collapse; margin: 8px 0 16px; font-variant-numeric: tabular-nums; }
th, td { border-bottom: 1px solid var(--rule); padding: 3px 8px; text-align: left; }
td.num, th.num { text-align: right; }
caption { text-align: left; font-weight: 600; padding: 4px 0; }
.fail { color: var(--bad); }
svg.chart { background: #fff; font-size: 11px; }
svg .axis line, svg .axis .domain { stroke: #444; stroke-width: 1; }
svg .axis text { fill: #333; }
svg .axis-label { font-size: 12px; fill: var(--ink); }
svg path.step { fill: none; stroke: var(--accent); stroke-width: 1.5; }
svg circle.point { fill: #fff; stroke: var(--accent); stroke-width: 1.5; }
svg circle.point.lightest { fill: var(--accent); }
svg rect.bar.pass { fill: #6b9ac4; }
svg rect.bar.fail { fill: var(--bad); }
svg line.limit { stroke: var(--bad); stroke-dasharray: 4 3; }
svg path.effect { fill: none; stroke: var(--accent); stroke-width: 1.5; }
svg circle.station { fill: var(--accent); }
svg .resistance line { stroke: var(--bad); stroke-dasharray: 6 3; }
svg .resistance.r1 line { stroke: #a0620b; }
svg .resistance text { fill: var(--ink); font-size: 11px; }
svg line.zero { stroke: #999; }
@media print {
  @page { size: A4; margin: 12mm; }
  body { font-size: 10pt; }
  header.page, footer.page { background: none; padding: 0; border: 0; margin: 0; }
  header.page h1 { font-size: 11pt; }
  .caution { font-size: 7pt; }
  main { padding: 0; }
  section.mark { break-before: page; border-top: 0; }
  thead { display: table-header-group; }
  tr, svg { break-inside: avoid; }
  table.frame > tbody > tr { break-inside: auto; }
}
/* the running header and footer: the head and foot of one table framing the report, repeated on every printed page */
table.frame { width: 100%; border-collapse: collapse; margin: 0; }
table.frame > thead > tr > td, table.frame > tfoot > tr > td, table.frame > tbody > tr > td { border: 0; padding: 0; }
table.frame > tfoot { display: table-footer-group; }
`;

const kg = (v: number) => Math.round(v).toLocaleString('en-GB');
const t3 = (v: number) => (v / 1000).toLocaleString('en-GB', { minimumFractionDigits: 3, maximumFractionDigits: 3 });
const money = (v: number | null) => (v === null ? '–' : v.toLocaleString('en-GB', { minimumFractionDigits: 2, maximumFractionDigits: 2 }));

function caution(): string {
  return `<p class="caution"><strong>Caution.</strong> ${esc(CAUTION)} ${esc(SCOPE)}</p>`;
}

function table(caption: string, head: string[], rows: string[][], numeric: boolean[]): string {
  const th = head.map((h, i) => `<th${numeric[i] ? ' class="num"' : ''} scope="col">${esc(h)}</th>`).join('');
  const body = rows.map((r) => `<tr>${r.map((c, i) => `<td${numeric[i] ? ' class="num"' : ''}>${c}</td>`).join('')}</tr>`).join('');
  return `<table><caption>${esc(caption)}</caption><thead><tr>${th}</tr></thead><tbody>${body}</tbody></table>`;
}

function markSection(m: ReportMark): string {
  const charts: string[] = [];
  charts.push(`<figure>${paretoChart(m.pareto, { title: `${m.mark}: depth against mass`, lightest: m.lightest ?? null })}<figcaption>Pareto front of overall depth h against mass per girder; filled point: lightest.</figcaption></figure>`);
  if (m.utilisation) {
    charts.push(`<figure>${utilisationChart(m.utilisation.checks, { title: `${m.mark}: utilisation` })}<figcaption>Governing checks of the ${m.utilisation.of} section; dashed line: utilisation 1.0.</figcaption></figure>`);
  }
  if (m.envelope) {
    const e = m.envelope;
    const mr = [
      ...(e.McRd !== undefined ? [{ name: 'McRd', value: e.McRd }] : []),
      ...(e.MbRd !== undefined ? [{ name: 'MbRd', value: e.MbRd }] : []),
    ];
    charts.push(`<figure>${envelopeChart(e.x, e.MEd, mr, { title: `${m.mark}: MEd`, yLabel: 'MEd (kNm)', symmetric: true })}<figcaption>Design moment envelope against the moment resistances (±).</figcaption></figure>`);
    const vr = e.VbRd !== undefined ? [{ name: 'VbRd', value: e.VbRd }] : [];
    charts.push(`<figure>${envelopeChart(e.x, e.VEd.map(Math.abs), vr, { title: `${m.mark}: VEd`, yLabel: '|VEd| (kN)', symmetric: false })}<figcaption>Design shear envelope (magnitude) against the shear resistance.</figcaption></figure>`);
  }
  const l = m.lightest;
  const facts = [
    `quantity ${m.quantity}`,
    ...(m.failed ? ['<strong class="fail">FAILED</strong>'] : []),
    l ? `lightest ${kg(l.mass)} kg at h = ${Math.round(l.depth)} mm${l.governing ? ` (governing: ${esc(l.governing)})` : ''}` : '<span class="fail">no feasible section</span>',
    ...(m.utilisation ? [`${m.utilisation.of} section ${m.utilisation.passes ? 'passes' : '<span class="fail">fails</span>'}`] : []),
  ];
  const notes = (m.notes ?? []).map((s) => `<p${m.failed ? ' class="fail"' : ''}>${esc(s)}</p>`).join('');
  const assumed = m.assumptions?.length
    ? table(`${m.mark}: assumed (not given in the input)`, ['field', 'value', 'meaning'], m.assumptions.map((a) => [esc(a.field), esc(Array.isArray(a.value) ? a.value.join(', ') : String(a.value)), esc(a.note)]), [false, false, false])
    : '';
  const basis = m.basis?.length ? `<ul class="basis">${m.basis.map((b) => `<li>${esc(b)}</li>`).join('')}</ul>` : '';
  const sect = m.section ? `<p class="section-words"><strong>${m.section.of === 'adopted' ? 'Adopted' : 'Lightest'} section:</strong> ${esc(m.section.words)}</p>` : '';
  const rows = m.pareto.map((p) => [String(Math.round(p.depth)), kg(p.mass), esc(p.governing ?? '')]);
  return `<section class="mark" id="mark-${esc(m.mark)}"><h2>${esc(m.mark)}</h2><p>${facts.join(' · ')}</p>${basis}${sect}${notes}<div class="charts">${charts.join('')}</div>${assumed}${rows.length ? table(`${m.mark}: Pareto points`, ['h (mm)', 'mass (kg)', 'governing'], rows, [true, true, false]) : ''}</section>`;
}

function reconciliationTable(r: ReportReconciliation): string {
  const rows = r.byMark.map((m) => [esc(m.mark), String(m.quantity), m.section, kg(m.perGirder), m.lightestPerGirder === null ? '–' : kg(m.lightestPerGirder), m.savingPerGirder === null ? '–' : kg(m.savingPerGirder), m.saving === null ? '–' : t3(m.saving)]);
  rows.push(['<strong>total</strong>', '', '', '', '', '', `<strong>${t3(r.saving)}</strong>`]);
  return `<p>Tonnage counted (adopted section where given, else the lightest): <strong>${t3(r.used)} t</strong> = ${t3(r.lightest)} t on the lightest sections + ${t3(r.saving)} t that adopting the lightest would save. Bearing stiffeners are counted in every figure.</p>${table('Saving of the lightest section against the section counted', ['mark', 'quantity', 'section counted', 'kg per girder', 'lightest, kg per girder', 'saving, kg per girder', 'saving (t)'], rows, [false, true, false, true, true, true, true])}`;
}

function tonnageSection(t: ReportTonnage, r?: ReportReconciliation, currency?: string | null): string {
  const costHead = currency ? `cost (${currency})` : 'cost';
  const withCost = t.cost !== null || t.byGrade.some((g) => g.cost !== null);
  const byMark = table(
    'Tonnage by mark',
    ['mark', 'quantity', 'length (mm)', 'kg per girder', 'kg/m', 'total (t)', ...(withCost ? [costHead] : [])],
    t.byMark.map((m) => [esc(m.mark), String(m.quantity), String(m.length), kg(m.perGirder.total), m.perMetre.toFixed(1), t3(m.total), ...(withCost ? [money(m.cost)] : [])]),
    [false, true, true, true, true, true, true],
  );
  const byGrade = table('Tonnage by grade', ['grade', 'mass (t)', ...(withCost ? [costHead] : [])], t.byGrade.map((g) => [esc(g.grade), t3(g.mass), ...(withCost ? [money(g.cost)] : [])]), [false, true, true]);
  const byThickness = table('Tonnage by thickness', ['product', 'thickness (mm)', 'mass (t)'], t.byThickness.map((b) => [b.kind === 'plate' ? 'plate' : 'flat bar', String(b.thickness), t3(b.mass)]), [false, true, true]);
  const plates = table(
    'Plate list',
    ['product', 'grade', 'thickness (mm)', 'width (mm)', 'length (mm)', 'count', 'mass (kg)', 'marks'],
    t.plates.map((p) => [p.kind === 'plate' ? 'plate' : 'flat bar', esc(p.grade), String(p.thickness), String(p.width), String(p.length), String(p.count), kg(p.mass), esc(p.marks.join(', '))]),
    [false, false, true, true, true, true, true, false],
  );
  const cur = currency ? ` ${esc(currency)}` : ' (the rates\' currency)';
  const total = `<p>Total ${t3(t.total)} t over ${t.girders} girders${t.cost !== null ? `; material cost ${money(t.cost)}${cur}` : ''}. Welds, snipes and cutting allowances are not included.</p>`;
  return `<section class="tonnage"><h2>Tonnage</h2>${total}${r ? reconciliationTable(r) : ''}${byMark}${byGrade}${byThickness}${plates}</section>`;
}

function coverageSection(c: ReportCoverage): string {
  if (c.leftOut.length === 0) return '';
  const excluded = c.leftOut.reduce((s, l) => s + l.quantity, 0);
  const est = new Map(c.estimates.map((e) => [e.mark, e]));
  const rows = c.leftOut.map((l) => {
    const e = est.get(l.mark);
    return [esc(l.mark), String(l.quantity), esc(l.reason), e?.mass != null ? t3(e.mass) : '–', `<span class="fail">${esc(e?.flag ?? 'no estimate: the totals are short by this mark')}</span>`];
  });
  const short = c.short.length > 0 ? ` Still short by ${esc(c.short.join(', '))} (no estimate).` : '';
  return `<section class="coverage"><h2>Not in the tonnage</h2><p class="fail">The tonnage (${t3(c.tonnage)} t) covers ${c.marks} marks, ${c.girders} girders. Left out: ${c.leftOut.length} marks, ${excluded} girders. With the flagged estimates below: ${t3(c.totalWithEstimates)} t.${short}</p>${table('Marks left out of the tonnage', ['mark', 'quantity', 'why', 'estimate (t)', 'flag'], rows, [false, true, false, true, false])}</section>`;
}

function rationalisationSection(r: ReportRationalisation): string {
  const unit = r.objective === 'mass' ? 't' : 'cost';
  const val = (v: number) => (r.objective === 'mass' ? t3(v) : money(v));
  const pct = (v: number | undefined) => (v === undefined ? '–' : `${(v * 100).toFixed(2)} %`);
  const rows = r.byK.map((k) =>
    k.feasible
      ? [String(k.K), val(k.total), val(k.penalty), pct(k.penaltyRatio), pct(k.gap), esc(k.status ?? ''), k.sections.map((x) => esc(sectionKeyInWords(x))).join('<br>')]
      : [String(k.K), '–', '–', '–', '–', '–', `<span class="fail">${esc(k.reason)}</span>`],
  );
  const base = r.unrationalised === null ? '<p class="fail">No mark has a feasible section; no rationalisation is possible.</p>' : `<p>Every mark in the model on its own best section: ${val(r.unrationalised)} ${unit === 't' ? 't' : ''}.${r.timeLimit !== undefined ? ` Time limit ${r.timeLimit} s; the gap is how far above the proven lower bound each answer can be.` : ''}</p>`;
  const left = r.leftOut && r.leftOut.length > 0 ? `<p class="fail">Left out of the rationalisation (no feasible candidate): ${esc(r.leftOut.map((l) => `${l.mark} ×${l.quantity}`).join(', '))}.</p>` : '';
  const p = r.plates;
  const lim = p ? [p.maxThicknesses !== null ? `${p.maxThicknesses} thicknesses` : null, p.maxWidths !== null ? `${p.maxWidths} flange widths` : null].filter(Boolean).join(', ') : '';
  const plates = !p
    ? ''
    : p.feasible
      ? `<p>Plates (at most ${esc(lim)}): ${val(p.total)} ${unit === 't' ? 't' : ''}, penalty ${pct(p.penaltyRatio)}, gap ${pct(p.gap)} (${esc(p.status)}); thicknesses ${esc(p.thicknesses.join(', '))} mm; flange widths ${esc(p.widths.join(', '))} mm.</p>`
      : `<p class="fail">Plates (at most ${esc(lim)}): ${esc(p.reason)}.</p>`;
  return `<section class="rationalisation"><h2>Rationalisation</h2>${base}${left}${r.byK.length > 0 ? table(`At most K distinct sections (${r.objective})`, ['K', `total (${unit})`, `penalty (${unit})`, 'penalty', 'gap', 'status', 'sections used'], rows, [true, true, true, true, true, false, false]) : ''}${plates}</section>`;
}

/**
 * One self-contained HTML file for a schedule result: inline CSS and SVG drawn here, nothing
 * fetched when viewed, no script. The caution and scope are printed in the header and the
 * footer, which repeat on every printed page (the head and foot of a table framing the report).
 */
export function renderReport(input: ReportInput): string {
  const head = `<header class="page"><h1>${esc(input.title)}</h1>${input.subtitle ? `<div>${esc(input.subtitle)}</div>` : ''}${caution()}</header>`;
  const foot = `<footer class="page">${caution()}${input.generatedAt ? `<p class="caution">Generated ${esc(input.generatedAt)}.</p>` : ''}</footer>`;
  const index = input.marks.length > 1 ? `<nav><p>Marks: ${input.marks.map((m) => `<a href="#mark-${esc(m.mark)}">${esc(m.mark)}</a>`).join(' · ')}</p></nav>` : '';
  const body = [index, ...(input.tonnage ? [tonnageSection(input.tonnage, input.reconciliation, input.currency)] : []), ...(input.coverage ? [coverageSection(input.coverage)] : []), ...(input.rationalisation ? [rationalisationSection(input.rationalisation)] : []), ...input.marks.map(markSection)].join('\n');
  return `<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:"><title>${esc(input.title)}</title><style>${STYLE}</style></head><body><table class="frame" role="presentation"><thead><tr><td>${head}</td></tr></thead><tfoot><tr><td>${foot}</td></tr></tfoot><tbody><tr><td><main>${body}</main></td></tr></tbody></table></body></html>\n`;
}

/**
 * A report mark from a published search and, when a section is adopted, its verdict: the
 * utilisation bars show the `top` most utilised applicable checks of the adopted section, or of
 * the lightest when none is adopted.
 */
export function markFromSearch(mark: string, quantity: number, search: PublishedSearch | null, adopted: PublishedVerdict | null = null, top = 8): ReportMark {
  const out: ReportMark = {
    mark,
    quantity,
    pareto: (search?.pareto ?? []).map((p) => ({ depth: p.depth, mass: p.mass, governing: p.governing.id })),
    lightest: search?.lightest ? { depth: search.lightest.depth, mass: search.lightest.mass, governing: search.lightest.governing.id } : null,
  };
  const src = adopted ? { of: 'adopted' as const, passes: adopted.passes, checks: adopted.checks } : search?.lightest ? { of: 'lightest' as const, passes: true, checks: search.lightest.checks } : null;
  if (src) {
    // one bar per check id: its worst station
    const worst = new Map<string, { id: string; clause: string; utilisation: number | null; passes: boolean }>();
    for (const c of src.checks) {
      if (!c.applies || c.utilisation === null) continue;
      const w = worst.get(c.id);
      if (!w || (w.utilisation ?? -1) < c.utilisation) worst.set(c.id, { id: c.id, clause: c.clause, utilisation: c.utilisation, passes: c.passes });
    }
    const checks = [...worst.values()].sort((a, b) => (b.utilisation ?? 0) - (a.utilisation ?? 0)).slice(0, top);
    out.utilisation = { of: src.of, passes: src.passes, checks };
  }
  const assumptions = search?.assumptions ?? adopted?.assumptions;
  if (assumptions?.length) out.assumptions = assumptions;
  if (search && search.pareto.length === 0) {
    const miss = search.nearMisses[0];
    out.notes = [
      miss
        ? `No feasible section; nearest miss ${kg(miss.mass)} kg at h = ${Math.round(miss.depth)} mm fails ${miss.failing.join(', ') || miss.governing.id}.`
        : 'No feasible section, and the search returned no nearest miss (every candidate was ruled out by a bound before any was judged).',
    ];
  }
  return out;
}
