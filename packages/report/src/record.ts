import type { PublishedCheck, RecordData } from '@platesmith/schema';
import { linesChart, sectionDrawing } from './charts.js';
import { esc } from './html.js';

/**
 * The calculation record of one girder: a self-contained printable HTML document (inline CSS
 * and SVG, no script, nothing fetched) that a checking engineer can sign. Every check in
 * calculation order with its clause, the formula in the standard's symbols, the values put in,
 * the result and utilisation. Printed (A4), a running header carries the title block, the
 * tool's version, the standards' editions and the input's hash, and a running footer the
 * caution and what is not covered: both repeat on every page.
 */

/** What each check evaluates, in the standard's symbols (equation numbers of the edition cited). */
export const FORMULAS: Readonly<Record<string, { name: string; lines: readonly string[] }>> = {
  classification: {
    name: 'Classification of the cross-section',
    lines: [
      'ε = √(235 / fy) for each plate at its own fy',
      'compression flange outstand (Table 5.2, sheet 2): c/t ≤ 9ε Class 1, ≤ 10ε Class 2, ≤ 14ε Class 3, c = (bf − tw)/2 − √2·a',
      'web, internal part (Table 5.2, sheet 1): in bending c/t ≤ 72ε, 83ε, 124ε; in bending and compression by α (Class 1, 2) and ψ (Class 3)',
      'the section takes the least favourable class of its compression parts (5.5.2(6))',
    ],
  },
  bending: {
    name: 'Bending resistance',
    lines: [
      'MEd / Mc,Rd ≤ 1 (6.12)',
      'Class 1, 2: Mc,Rd = Mpl,Rd = Wpl·fy / γM0 (6.13); Class 3: Mc,Rd = Mel,Rd = Wel,min·fy / γM0 (6.14)',
      'Class 4: Mc,Rd = Meff,Rd = Weff,min·fy / γM0 (6.15), effective section by EN 1993-1-5 4.3, 4.4: ρ = (λ̄p − 0.188)/λ̄p² outstand, ρ = (λ̄p − 0.055(3 + ψ))/λ̄p² internal, λ̄p = (b̄/t) / (28.4 ε √kσ)',
      'each plate at its own fy',
    ],
  },
  shear: {
    name: 'Plastic shear resistance',
    lines: ['VEd / Vpl,Rd ≤ 1 (6.17)', 'Vpl,Rd = Av·(fy / √3) / γM0 (6.18), Av = η·hw·tw (6.2.6(3)(d))'],
  },
  'shear-buckling': {
    name: 'Shear buckling resistance',
    lines: [
      'η3 = VEd / Vb,Rd ≤ 1 (5.10)',
      'Vb,Rd = Vbw,Rd + Vbf,Rd ≤ η·fyw·hw·tw / (√3·γM1) (5.1)',
      'Vbw,Rd = χw·fyw·hw·tw / (√3·γM1) (5.2); χw from Table 5.1 with λ̄w = hw / (37.4·tw·ε·√kτ) (5.6)',
      'kτ = 5.34 + 4(hw/a)² for a/hw ≥ 1, 4 + 5.34(hw/a)² for a/hw < 1 (A.5)',
      'Vbf,Rd = bf·tf²·fyf / (c·γM1) · [1 − (MEd / Mf,Rd)²] (5.8), c = a·[0.25 + 1.6·bf·tf²·fyf / (tw·hw²·fyw)]',
    ],
  },
  'bending-shear': {
    name: 'Interaction of bending and shear',
    lines: ['η̄1 + (1 − Mf,Rd / Mpl,Rd)·(2η̄3 − 1)² ≤ 1 for η̄3 > 0.5 (EN 1993-1-5 7.1, eq. 7.1)', 'η̄1 = MEd / Mpl,Rd, η̄3 = VEd / Vbw,Rd; not verified within hw/2 of a support (7.1(5))', 'webs without the buckling check: reduced yield strength (1 − ρ)·fy, ρ = (2VEd / Vpl,Rd − 1)² (EN 1993-1-1 6.2.8)'],
  },
  'flange-induced-buckling': {
    name: 'Flange-induced buckling',
    lines: ['hw / tw ≤ k·(E / fyf)·√(Aw / Afc) (8.1)', 'k = 0.3 plastic rotation, 0.4 plastic moment, 0.55 elastic moment resistance utilised'],
  },
  'patch-loading': {
    name: 'Resistance to transverse forces (patch loading)',
    lines: [
      'η2 = FEd / (fyw·Leff·tw / γM1) ≤ 1 (6.14)',
      'Leff = χF·ℓy (6.2), χF = 0.5 / λ̄F ≤ 1 (6.3), λ̄F = √(ℓy·tw·fyw / Fcr) (6.4)',
      'Fcr = 0.9·kF·E·tw³ / hw (6.5); kF = 6 + 2(hw/a)² for type (a) (Figure 6.1)',
      'ℓy = ss + 2tf·(1 + √(m1 + m2)) ≤ a (6.10), m1 = fyf·bf / (fyw·tw) (6.8), m2 = 0.02(hw/tf)² if λ̄F > 0.5, else 0 (6.9)',
    ],
  },
  'patch-bending': {
    name: 'Interaction of transverse force and bending',
    lines: ['η2 + 0.8·η1 ≤ 1.4 (7.2, eq. 7.2)', 'η1 = MEd / (fy·Weff / γM0) at the force, η2 = FEd / FRd'],
  },
  'stiffener-stiffness': {
    name: 'Intermediate transverse stiffeners: stiffness',
    lines: ['Ist ≥ 1.5·hw³·tw³ / a² for a/hw < √2; Ist ≥ 0.75·hw·tw³ for a/hw ≥ √2 (9.6)', 'Ist of the stiffener with 15ε·tw of web each side (9.1(2))'],
  },
  'stiffener-strength': {
    name: 'Intermediate transverse stiffeners: strength as a strut',
    lines: ['NEd = VEd − fyw·hw·tw / (√3·γM1·λ̄w²) ≥ 0, λ̄w of the panel with the stiffener removed (9.3.3(3))', 'NEd ≤ Nb,Rd = χ·A·fy / γM1 (EN 1993-1-1 6.47), curve c, Lcr = 0.75·hw (9.4(2))'],
  },
  'load-bearing-stiffener': {
    name: 'Load-bearing stiffeners under concentrated forces',
    lines: [
      'NEd = F + Ntf, Ntf = VEd − fyw·hw·tw / (√3·γM1·λ̄w²) ≥ 0 where the pair bounds shear panels (9.3.3(3) eq. 9.7, λ̄w of the panel without it)',
      'NEd ≤ Nb,Rd = χ·A·fy / γM1 (EN 1993-1-1 6.47), curve c, A with 15ε·tw of web each side (9.1(2)); Lcr = 0.75·hw with both flanges held laterally there, else hw (9.4(2))',
      'fitted end: F ≤ 2·(bs − snipe)·ts·fy / γM0; welds to the web: NEd / (4·(hw − 2·snipe)) ≤ fvw,d·a (EN 1993-1-8 4.5.3.3)',
      'IT / Ip ≥ 5.3·fy / E (9.3); Ist ≥ Ist,min as a rigid panel boundary (9.6); bs within the flange outstand',
    ],
  },
  'restraint-stiffener': {
    name: 'Stiffeners at lateral restraints',
    lines: [
      'Fr = αm·NEd / 100 (EN 1993-1-1 5.3.3(4)), αm = 1, NEd = MEd / hs of the compression flange held there',
      'Fr·hw ≤ W·fy / γM0 (the pair as a cantilever out of the web plane, W with 15ε·tw of web each side); IT / Ip ≥ 5.3·fy / E (EN 1993-1-5 9.3)',
    ],
  },
  'stiffener-torsion': {
    name: 'Torsional buckling of stiffeners',
    lines: ['IT / Ip ≥ 5.3·fy / E (9.3)'],
  },
  'end-post': {
    name: 'End post',
    lines: ['rigid end post: two double-sided stiffeners e ≥ 0.1·hw apart, each Ast ≥ 4·hw·tw² / e (9.3.1(3), (4))', 'non-rigid: a single double-sided bearing stiffener (9.3.1(5))'],
  },
  'bearing-stiffener': {
    name: 'Bearing stiffeners',
    lines: ['R ≤ Nb,Rd = χ·A·fy / γM1, curve c, Lcr = 0.75·hw, A with 15ε·tw of web each side (9.4)', 'R ≤ Fb,Rd = Abearing·fy / γM0 over the net area after the corner snipes'],
  },
  'lateral-torsional-buckling': {
    name: 'Lateral-torsional buckling',
    lines: [
      'MEd / Mb,Rd ≤ 1 (6.54), Mb,Rd = χLT·Wy·fy / γM1 (6.55)',
      'χLT = 1 / (ΦLT + √(ΦLT² − β·λ̄LT²)) ≤ 1 (6.56, 6.57), ΦLT = 0.5·[1 + αLT·(λ̄LT − λ̄LT,0) + β·λ̄LT²]',
      'λ̄LT = √(Wy·fy / Mcr)',
      'Mcr = C1·π²·E·Iz / L² · {√[Iw/Iz + L²·G·It / (π²·E·Iz) + (C2·zg − C3·zj)²] − (C2·zg − C3·zj)} (three-factor formula)',
      'segments between the lateral restraints of the compression flange, each sign with its own flange',
    ],
  },
  deflection: {
    name: 'Deflection (serviceability)',
    lines: ['δ = ∫ M·m / (E·Iy) dx + ∫ V·v / (G·Av) dx ≤ span / ratio (EN 1990 A1.4.3, EN 1993-1-1 7.2.1)'],
  },
  'web-flange-weld': {
    name: 'Web-to-flange fillet welds',
    lines: ['Fw,Ed = √(vEd² + qEd²) ≤ Fw,Rd = a·fvw,d (EN 1993-1-8 4.5.3.3)', 'vEd = VEd·Sf / Iy shared by the two welds; qEd from a force through the flange over ss + 5·tf', 'fvw,d = fu / (√3·βw·γM2) (4.4)'],
  },
};

/** The standard's symbol for a `values` key (ASCII names in the JSON, symbols in the record). */
const SYMBOLS: Record<string, string> = {
  McRd: 'Mc,Rd', MplRd: 'Mpl,Rd', MelRd: 'Mel,Rd', MeffRd: 'Meff,Rd', MfRd: 'Mf,Rd', MbRd: 'Mb,Rd', MEd: 'MEd', MEdMax: 'MEd,max', MRdElastic: 'MRd (elastic)',
  VEd: 'VEd', VplRd: 'Vpl,Rd', VbwRd: 'Vbw,Rd', VbfRd: 'Vbf,Rd', VbRd: 'Vb,Rd', NEd: 'NEd', NbRd: 'Nb,Rd', FRd: 'FRd', FbRd: 'Fb,Rd', Fcr: 'Fcr',
  kTau: 'kτ', lambdaW: 'λ̄w', chiW: 'χw', lambdaF: 'λ̄F', chiF: 'χF', kF: 'kF', lambdaLT: 'λ̄LT', lambdaLT0: 'λ̄LT,0', chiLT: 'χLT', phiLT: 'ΦLT',
  lambdaBar: 'λ̄', chi: 'χ', lambdaWRemoved: 'λ̄w (stiffener removed)', eta1: 'η1', eta2: 'η2', eta3: 'η3', psi: 'ψ', psiWeb: 'ψ (web)', alpha: 'α',
  rhoFlange: 'ρ (flange)', rhoWeb: 'ρ (web)', Weff: 'Weff', Aeff: 'Aeff', Ieff: 'Ieff', zEff: 'z (effective)', Av: 'Av', Ast: 'Ast', AstMin: 'Ast,min',
  Ist: 'Ist', IstMin: 'Ist,min', ItOverIp: 'IT/Ip', hwOverTw: 'hw/tw', cOverTflange: 'c/t (flange)', cOverTweb: 'c/t (web)', Afc: 'Afc', fyf: 'fyf', fyw: 'fyw',
  vEd: 'vEd', qEd: 'qEd', FwEd: 'Fw,Ed', FwRd: 'Fw,Rd', fvwd: 'fvw,d', aRequired: 'a required', throat: 'a', ly: 'ℓy', Leff: 'Leff', Lseg: 'L (segment)',
  sectionClass: 'section class', flangeClass: 'flange class', webClass: 'web class', limit: 'limit', ratio: 'ratio', k: 'k', m1: 'm1', m2: 'm2',
  x0: 'x0', x1: 'x1', zg: 'zg', zj: 'zj', C1: 'C1', C2: 'C2', C3: 'C3', eMin: 'emin', delta: 'δ', Iy: 'Iy', eN: 'eN', Abearing: 'Abearing', weldThroatInC: 'a (in c)',
};

const UNIT_TEXT: Record<string, string> = { mm2: 'mm²', mm3: 'mm³', mm4: 'mm⁴', '-': '' };

function unitText(u: string | undefined): string {
  if (u === undefined || u === '-') return '';
  return ` ${esc(UNIT_TEXT[u] ?? u)}`;
}

function sym(k: string): string {
  const m = /^(.*)_(sagging|hogging|top|bot|bottom)$/.exec(k);
  if (m) return `${SYMBOLS[m[1]!] ?? m[1]!} (${m[2]})`;
  return SYMBOLS[k] ?? k;
}

/** A number for print: 4 significant figures, grouped thousands, no exponent below 1e12. */
export function num(v: number, sig = 4): string {
  if (!Number.isFinite(v)) return v > 0 ? '∞' : String(v);
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (Number.isInteger(v) && a < 1e12) return v.toLocaleString('en-GB');
  if (a >= 1e12 || a < 1e-4) {
    const [m, e] = v.toExponential(sig - 1).split('e');
    const sup = '⁰¹²³⁴⁵⁶⁷⁸⁹';
    return `${m} × 10${Number(e).toString().replace('-', '⁻').replace(/[0-9]/g, (c) => sup[Number(c)]!)}`;
  }
  const digits = Math.max(0, sig - Math.ceil(Math.log10(a + 1e-300)));
  return v.toLocaleString('en-GB', { minimumFractionDigits: 0, maximumFractionDigits: Math.min(digits, 6) });
}

const val = (v: string | null) => (v === null || v === '' ? '<span class="blank">&nbsp;</span>' : esc(v));

const STYLE = `
:root { --ink:#1b1f24; --muted:#5b6570; --rule:#c9d0d6; --accent:#1f5f8b; --ok:#2e7d4f; --bad:#b3261e; }
* { box-sizing: border-box; }
html, body { margin: 0; }
body { font: 13px/1.45 system-ui, "Segoe UI", Roboto, Helvetica, Arial, sans-serif; color: var(--ink); max-width: 190mm; margin: 0 auto; padding: 0 8px; }
header.page, footer.page { font-size: 11px; color: var(--muted); }
header.page { border-bottom: 1px solid var(--rule); padding: 6px 0; }
footer.page { border-top: 1px solid var(--rule); padding: 6px 0; margin-top: 24px; }
.running { display: flex; flex-wrap: wrap; gap: 2px 14px; }
.running b { color: var(--ink); font-weight: 600; }
.caution { margin: 0; overflow-wrap: anywhere; }
.caution strong { color: var(--bad); }
h1 { font-size: 20px; margin: 12px 0 4px; }
h2 { font-size: 16px; border-bottom: 2px solid var(--accent); padding-bottom: 2px; margin: 20px 0 8px; break-after: avoid; }
h3 { font-size: 14px; margin: 14px 0 4px; break-after: avoid; }
table { border-collapse: collapse; margin: 6px 0 12px; font-variant-numeric: tabular-nums; max-width: 100%; }
th, td { border: 1px solid var(--rule); padding: 2px 6px; text-align: left; vertical-align: top; overflow-wrap: anywhere; }
td.num, th.num { text-align: right; white-space: nowrap; }
table.props td:last-child, table.props th:last-child { white-space: nowrap; }
caption { text-align: left; font-weight: 600; padding: 2px 0; }
table.title-block { width: 100%; table-layout: fixed; }
table.title-block th { width: 16%; background: #f3f5f7; font-weight: 600; }
.blank { display: inline-block; min-width: 40mm; border-bottom: 1px dotted var(--muted); }
ul { margin: 4px 0 8px; padding-left: 20px; }
.formula { font-family: "Cambria Math", "STIX Two Math", Georgia, serif; font-size: 13px; margin: 2px 0; overflow-wrap: anywhere; }
dl.values { display: grid; grid-template-columns: repeat(auto-fill, minmax(42mm, 1fr)); gap: 1px 10px; margin: 4px 0; font-variant-numeric: tabular-nums; }
dl.values div { display: flex; justify-content: space-between; gap: 6px; border-bottom: 1px dotted var(--rule); min-width: 0; }
dl.values dt { color: var(--muted); overflow-wrap: anywhere; }
dl.values dd { margin: 0; text-align: right; white-space: nowrap; }
.result { font-weight: 600; margin: 4px 0 0; }
.pass { color: var(--ok); }
.fail { color: var(--bad); }
.na { color: var(--muted); }
section.check { border-top: 1px solid var(--rule); padding-top: 4px; break-inside: avoid; }
figure { margin: 6px 0; }
figcaption { font-size: 11px; color: var(--muted); }
svg.chart { max-width: 100%; height: auto; background: #fff; font-size: 11px; }
svg .axis line, svg .axis .domain { stroke: #444; stroke-width: 1; }
svg .axis text { fill: #333; }
svg .axis-label { font-size: 12px; fill: var(--ink); }
svg line.zero { stroke: #999; }
svg path.series { fill: none; stroke-width: 1.6; }
svg .s0 { stroke: var(--accent); }
svg .s1 { stroke: #a0620b; }
svg .s2 { stroke: #2e7d4f; }
svg path.area { stroke: none; opacity: 0.12; }
svg path.area.s0 { fill: var(--accent); }
svg path.area.s1 { fill: #a0620b; }
svg .legend-item line { stroke-width: 2; }
svg .legend-item text { fill: var(--ink); }
svg .ref line { stroke: var(--bad); stroke-dasharray: 5 3; }
svg .ref text { fill: var(--bad); }
svg .mark circle { fill: #fff; stroke: var(--bad); stroke-width: 1.5; }
svg rect.plate { fill: #d6e2ec; stroke: var(--ink); stroke-width: 1; }
svg .dim line { stroke: #444; stroke-width: 0.8; }
svg .dim text, svg .dim-note { fill: var(--ink); font-size: 11px; }
svg line.na { stroke: #a0620b; stroke-dasharray: 8 3 2 3; }
.charts { display: flex; flex-wrap: wrap; gap: 8px; }
.charts figure { flex: 1 1 85mm; min-width: 0; }
.side { display: flex; flex-wrap: wrap; gap: 12px; align-items: flex-start; }
.side > * { flex: 1 1 80mm; min-width: 0; }
@media print {
  @page { size: A4; margin: 12mm 12mm 12mm; }
  body { font-size: 9.5pt; max-width: none; padding: 0; }
  header.page, footer.page { font-size: 7pt; }
  footer.page { margin-top: 3mm; }
  h2 { break-after: avoid; }
  tr, figure, svg { break-inside: avoid; }
  table.frame > tbody > tr { break-inside: auto; }
}
table.frame { width: 100%; border-collapse: collapse; margin: 0; }
table.frame > thead > tr > td, table.frame > tfoot > tr > td, table.frame > tbody > tr > td { border: 0; padding: 0; }
table.frame > thead { display: table-header-group; }
table.frame > tfoot { display: table-footer-group; }
`;

function caution(d: RecordData): string {
  return `<p class="caution"><strong>Caution.</strong> ${esc(d.caution)} ${esc(d.scope)}</p>`;
}

function table(caption: string, head: string[], rows: string[][], numeric: boolean[], cls = ''): string {
  const th = head.map((h, i) => `<th${numeric[i] ? ' class="num"' : ''} scope="col">${esc(h)}</th>`).join('');
  const body = rows.map((r) => `<tr>${r.map((c, i) => `<td${numeric[i] ? ' class="num"' : ''}>${c}</td>`).join('')}</tr>`).join('');
  return `<table${cls ? ` class="${cls}"` : ''}><caption>${esc(caption)}</caption><thead><tr>${th}</tr></thead><tbody>${body}</tbody></table>`;
}

function titleBlock(d: RecordData): string {
  const t = d.title;
  const row = (a: string, av: string | null, b: string, bv: string | null) => `<tr><th scope="row">${esc(a)}</th><td>${val(av)}</td><th scope="row">${esc(b)}</th><td>${val(bv)}</td></tr>`;
  return `<table class="title-block"><caption>Title block</caption><tbody>${row('Project', t.project, 'Mark', t.mark)}${row('Revision', t.revision, 'Date', t.date)}${row('Prepared by', t.preparedBy, 'Checked by', t.checkedBy)}${row('Tool', `${d.tool.name} ${d.tool.version}`, 'Input SHA-256', d.inputHash.slice(0, 16))}</tbody></table>`;
}

function basisSection(d: RecordData): string {
  const b = d.basis;
  const items: string[] = [];
  items.push(`Girder length ${num(b.length)} mm; spans ${b.spans.map((s) => `${num(s)} mm`).join(' + ')}; ${esc(b.supportsText)} (supports at x = ${b.supports.map((x) => num(x)).join(', ')} mm).`);
  if (b.form === 'effects') items.push('Design effects given at stations (the user’s own analysis); no actions analysed here.');
  if (b.form === 'envelope') items.push('Design effects from the user’s own global analysis (an envelope of stations); no actions analysed here.');
  if (b.combination) items.push(`Combinations: ${esc(b.combination)}, every variable action leading in turn, each variable action patterned span by span.`);
  if (b.combinationFactors) {
    const f = b.combinationFactors;
    items.push(`Combination factors (EN 1990 Table A1.2(B)): γG,sup = ${f.gammaGsup}, γG,inf = ${f.gammaGinf}, γQ = ${f.gammaQ}, ξ = ${f.xi}.`);
  }
  items.push(`Partial factors (${esc(b.factorSet)}): γM0 = ${b.gammaM0}, γM1 = ${b.gammaM1}, γM2 = ${b.gammaM2}; η = ${b.eta}.`);
  items.push(`Steel: web ${esc(b.grades.web)}, flanges ${esc(b.grades.flanges)}, stiffeners ${esc(b.grades.stiffeners)}; fy and fu by plate thickness from ${esc(b.fySource)}; E = 210 000 MPa, G = 81 000 MPa.`);
  items.push(`Lateral restraint of the top flange: ${esc(b.restraintTop)}; of the bottom flange: ${esc(b.restraintBottom)}. Load applied ${esc(b.loadHeight)}. Lateral-torsional buckling by ${esc(b.ltbMethod)}.`);
  if (b.deflectionLimits.length) items.push(`Deflection limits: ${b.deflectionLimits.map((l) => `${esc(l.name)} span/${l.ratio}`).join('; ')}.`);
  if (b.selfWeight !== null) items.push(`Self-weight of the girder added as a permanent action: ${num(b.selfWeight)} kN/m.`);
  const actions = b.actions.length
    ? table(
        'Characteristic actions',
        ['action', 'kind', 'load', 'value', 'position (mm)', 'ψ from', 'ψ0', 'ψ1', 'ψ2'],
        b.actions.map((a) => [
          esc(a.name),
          a.kind,
          a.load,
          `${num(a.value)} ${a.unit}`,
          a.at !== undefined ? `x = ${num(a.at)}` : a.from !== undefined ? `${num(a.from)}–${num(a.to ?? b.length)}` : 'whole girder',
          a.psiSource === null ? '–' : esc(a.psiSource),
          a.psi0 === null ? '–' : String(a.psi0),
          a.psi1 === null ? '–' : String(a.psi1),
          a.psi2 === null ? '–' : String(a.psi2),
        ]),
        [false, false, false, true, false, false, true, true, true],
      )
    : '';
  const combos = b.combinations.length ? `<details><summary>${b.combinations.length} ULS combinations analysed</summary><ul>${b.combinations.map((c) => `<li>${esc(c)}</li>`).join('')}</ul></details>` : '';
  const assumptions = b.assumptions.length ? `<h3>Assumptions taken by default</h3><ul class="assumptions">${b.assumptions.map((a) => `<li>${esc(a)}</li>`).join('')}</ul>` : '<h3>Assumptions taken by default</h3><p>None: every option was given.</p>';
  return `<section class="basis"><h2>1 Design basis</h2><ul>${items.map((i) => `<li>${i}</li>`).join('')}</ul>${actions}${combos}${assumptions}</section>`;
}

function analysisSection(d: RecordData): string {
  const a = d.analysis;
  const x = a.stations.map((s) => s.x);
  const mChart = linesChart(x, [{ name: 'MEd max', y: a.stations.map((s) => s.MEdMax) }, { name: 'MEd min', y: a.stations.map((s) => s.MEdMin) }], { title: 'Design bending moment envelope', yLabel: 'MEd (kNm)', fill: true });
  const vChart = linesChart(x, [{ name: 'VEd max', y: a.stations.map((s) => s.VEdMax) }, { name: 'VEd min', y: a.stations.map((s) => s.VEdMin) }], { title: 'Design shear force envelope', yLabel: 'VEd (kN)', fill: true });
  const e = a.extremes;
  const g = e.governing;
  const rows = [
    ['MEd,max (sagging)', `${num(e.MEdMax)} kNm`, `x = ${num(e.at.MEdMax)} mm`, g ? esc(g.MEdMax) : 'as given'],
    ['MEd,min (hogging)', `${num(e.MEdMin)} kNm`, `x = ${num(e.at.MEdMin)} mm`, g ? esc(g.MEdMin) : 'as given'],
    ['|VEd|,max', `${num(e.VEdMax)} kN`, `x = ${num(e.at.VEdMax)} mm`, g ? esc(g.VEdMax) : 'as given'],
  ];
  const extremes = table('Design effects and the combinations that govern them', ['effect', 'value', 'where', 'governing combination'], rows, [false, true, false, false]);
  const reactions = table('Design support reactions', ['support x (mm)', 'R (kN)'], a.reactions.map((r) => [num(r.x), num(r.R)]), [true, true]);
  const forces = a.forces.length ? table('Concentrated design forces through the top flange', ['x (mm)', 'FEd (kN)', 'ss (mm)'], a.forces.map((f) => [num(f.x), num(f.F), num(f.ss)]), [true, true, true]) : '';
  const defl = a.deflection.length
    ? table('Deflection (serviceability)', ['limit', 'δ (mm)', 'limit (mm)', 'at x (mm)', 'utilisation'], a.deflection.map((q) => [`${esc(q.name)} span/${q.ratio}`, num(q.delta), num(q.limit), q.at === null ? '–' : num(q.at), q.utilisation === null ? '∞' : q.utilisation.toFixed(3)]), [false, true, true, true, true])
    : '<p>No deflection limit was checked.</p>';
  return `<section class="analysis"><h2>2 Analysis</h2><p>Design values of the ULS combinations${d.basis.selfWeight !== null ? ', the girder’s self-weight included' : ''}: sagging moments positive (top flange in compression).</p><div class="charts"><figure>${mChart}<figcaption>Bending moment diagram: the largest and the least MEd over the combinations at each station.</figcaption></figure><figure>${vChart}<figcaption>Shear force diagram: the largest and the least VEd over the combinations at each station.</figcaption></figure></div>${extremes}<div class="side">${reactions}${forces}</div>${defl}</section>`;
}

function sectionSection(d: RecordData): string {
  const s = d.section;
  const j = s.json;
  const p = s.properties;
  const drawing = sectionDrawing({ hw: j.web.depth, tw: j.web.thickness, bTop: j.topFlange.width, tTop: j.topFlange.thickness, bBot: j.bottomFlange.width, tBot: j.bottomFlange.thickness }, { title: 'Cross-section (mm)', zElastic: p.zElastic });
  const props = table(
    'Gross section properties',
    ['property', 'value', 'unit'],
    [
      ['overall depth h', num(p.h), 'mm'],
      ['area A', num(p.A), 'mm²'],
      ['second moment Iy', num(p.Iy), 'mm⁴'],
      ['second moment Iz', num(p.Iz), 'mm⁴'],
      ['torsion constant It', num(p.It), 'mm⁴'],
      ['warping constant Iw', num(p.Iw), 'mm⁶'],
      ['elastic modulus Wel,min', num(p.Wel), 'mm³'],
      ['elastic neutral axis above the underside', num(p.zElastic), 'mm'],
      ['plastic neutral axis above the underside', num(p.zPlastic), 'mm'],
      ['shear centre above the underside', num(p.zShear), 'mm'],
      ['fy web / top flange / bottom flange', `${p.fyw} / ${p.fyTop} / ${p.fyBot}`, 'MPa'],
      ['Mpl (no partial factor)', num(p.MplRk), 'kNm'],
      ['Mel, first yield (no partial factor)', num(p.MelRk), 'kNm'],
      ['mass per metre', num(p.massPerMetre), 'kg/m'],
      ['mass of the girder (with bearing stiffeners)', num(p.mass), 'kg'],
    ],
    [false, true, false],
    'props',
  );
  const classes = s.classes.length ? table('Classification (EN 1993-1-1 Table 5.2)', ['moment sign', 'flange', 'web', 'section'], s.classes.map((c) => [c.sign, String(c.flange), String(c.web), `Class ${c.section}`]), [false, true, true, false]) : '';
  return `<section class="section"><h2>3 Section</h2><ul class="plates">${s.plates.map((x) => `<li>${esc(x)}</li>`).join('')}</ul><p>Prismatic: one section over the whole length.</p><div class="side"><figure>${drawing}<figcaption>Cross-section to scale, dimensions in mm; dash-dot: elastic neutral axis.</figcaption></figure><div>${props}${classes}</div></div></section>`;
}

function resultText(c: PublishedCheck): string {
  if (!c.applies) return `<p class="result na">Does not apply: ${esc(c.reason ?? '')}</p>`;
  const u = c.utilisation === null ? '∞' : c.utilisation.toFixed(3);
  return `<p class="result ${c.passes ? 'pass' : 'fail'}">Utilisation ${u}${c.at === null ? '' : ` at x = ${num(c.at)} mm`} — ${c.passes ? 'satisfied' : 'NOT SATISFIED'}</p>`;
}

function checkSection(c: PublishedCheck, i: number): string {
  const f = FORMULAS[c.id] ?? { name: c.id, lines: [] };
  const entries = Object.entries(c.values);
  const nums = entries.filter(([, v]) => typeof v === 'number') as [string, number][];
  const notes = entries.filter(([, v]) => typeof v !== 'number');
  const values = nums.length
    ? `<dl class="values">${nums.map(([k, v]) => `<div><dt>${esc(sym(k))}</dt><dd>${esc(num(v))}${unitText(c.units[k])}</dd></div>`).join('')}</dl>`
    : '';
  const noteText = notes.length ? `<p class="notes">${notes.map(([k, v]) => `${esc(sym(k))}: ${esc(String(v))}`).join('; ')}</p>` : '';
  return `<section class="check" id="check-${esc(c.id)}"><h3>4.${i + 1} ${esc(f.name)} <span class="clause">— ${esc(c.clause)}</span></h3>${f.lines.map((l) => `<p class="formula">${esc(l)}</p>`).join('')}${values}${noteText}${resultText(c)}</section>`;
}

function checksSection(d: RecordData): string {
  const v = d.verdict;
  const x = d.alongSpan.map((p) => p.x);
  const marks = v.checks
    .filter((c) => c.applies && c.at !== null && c.utilisation !== null && c.id !== 'bending' && c.id !== 'shear')
    .map((c) => ({ x: c.at!, y: c.utilisation!, label: `${c.id} (${c.clause}): ${c.utilisation!.toFixed(3)}` }));
  const chart = linesChart(x, [{ name: '|MEd| / Mc,Rd', y: d.alongSpan.map((p) => p.bending) }, { name: '|VEd| / Vpl,Rd', y: d.alongSpan.map((p) => p.shear) }], { title: 'Utilisation along the span', yLabel: 'utilisation (-)', refs: [{ name: 'limit 1.0', value: 1 }], marks });
  const summary = table(
    'Summary of the checks',
    ['§', 'check', 'clause', 'utilisation', 'result'],
    v.checks.map((c, i) => [`4.${i + 1}`, esc(c.id), esc(c.clause), c.applies ? (c.utilisation === null ? '∞' : c.utilisation.toFixed(3)) : '–', c.applies ? (c.passes ? '<span class="pass">ok</span>' : '<span class="fail">FAILS</span>') : '<span class="na">n/a</span>']),
    [false, false, false, true, false],
  );
  const g = v.governing;
  const verdict = `<p class="result ${v.passes ? 'pass' : 'fail'}">${v.passes ? 'The section satisfies every check.' : 'The section does NOT satisfy every check.'} Governing: ${esc(g.id)} (${esc(g.clause)}), utilisation ${g.utilisation === null ? '∞' : g.utilisation.toFixed(3)}${g.at === null ? '' : ` at x = ${num(g.at)} mm`}.</p>`;
  return `<section class="checks"><h2>4 Checks</h2>${verdict}<figure>${chart}<figcaption>Utilisation along the span: bending and plastic shear at every station (lines); the other checks at their governing station (circles; hover for the check).</figcaption></figure>${summary}${v.checks.map(checkSection).join('')}</section>`;
}

/** The calculation record as one self-contained HTML document. */
export function renderRecord(d: RecordData): string {
  const t = d.title;
  const name = [t.project, t.mark].filter((s) => s).join(' — ') || 'Girder';
  const running = `<div class="running"><span><b>${esc(name)}</b></span><span>rev. ${esc(t.revision ?? '–')}</span><span>${esc(d.tool.name)} ${esc(d.tool.version)}</span><span>${esc(d.editions.join(', '))}</span><span>input SHA-256 ${esc(d.inputHash.slice(0, 16))}</span></div>`;
  // the running header and footer are the head and foot of one table that frames the whole
  // record: a browser repeats them on every printed page (CSS 2.1 17.2, table-header-group and
  // table-footer-group), in its own print dialog as in headless printing
  const head = `<header class="page">${running}</header>`;
  const foot = `<footer class="page">${caution(d)}</footer>`;
  const body = [`<h1>Calculation record: ${esc(name)}</h1>`, titleBlock(d), basisSection(d), analysisSection(d), sectionSection(d), checksSection(d)].join('\n');
  const frame = `<table class="frame" role="presentation"><thead><tr><td>${head}</td></tr></thead><tfoot><tr><td>${foot}</td></tr></tfoot><tbody><tr><td><main>${body}</main></td></tr></tbody></table>`;
  return `<!DOCTYPE html>\n<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'; img-src data:"><title>${esc(`Calculation record — ${name}`)}</title><style>${STYLE}</style></head><body>${frame}</body></html>\n`;
}
