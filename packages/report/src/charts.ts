import { scaleLinear, type ScaleLinear } from 'd3-scale';
import { curveStepAfter, line } from 'd3-shape';
import { esc } from './html.js';

/** Chart frame in SVG user units (px at 100 %). */
export interface Frame {
  width: number;
  height: number;
  margin: { top: number; right: number; bottom: number; left: number };
}

const FRAME: Frame = { width: 520, height: 300, margin: { top: 16, right: 20, bottom: 48, left: 72 } };
const n = (v: number) => (Math.round(v * 100) / 100).toString();

function fmt(v: number): string {
  const a = Math.abs(v);
  if (a >= 1e4) return Math.round(v).toLocaleString('en-GB');
  if (a >= 100) return Math.round(v).toString();
  return (Math.round(v * 100) / 100).toString();
}

function xAxis(x: ScaleLinear<number, number>, y0: number, label: string, f: Frame, ticks = 6): string {
  const t = x.ticks(ticks);
  const marks = t.map((v) => `<g class="tick" transform="translate(${n(x(v))},0)"><line y2="5"/><text y="18" text-anchor="middle">${esc(fmt(v))}</text></g>`).join('');
  const [a, b] = x.range() as [number, number];
  return `<g class="axis x-axis" transform="translate(0,${n(y0)})"><line class="domain" x1="${n(a)}" x2="${n(b)}"/>${marks}<text class="axis-label" x="${n((a + b) / 2)}" y="${f.margin.bottom - 8}" text-anchor="middle">${esc(label)}</text></g>`;
}

function yAxis(y: ScaleLinear<number, number>, x0: number, label: string, f: Frame, ticks = 5): string {
  const t = y.ticks(ticks);
  const marks = t.map((v) => `<g class="tick" transform="translate(0,${n(y(v))})"><line x2="-5"/><text x="-8" dy="0.32em" text-anchor="end">${esc(fmt(v))}</text></g>`).join('');
  const [a, b] = y.range() as [number, number];
  const mid = (a + b) / 2;
  return `<g class="axis y-axis" transform="translate(${n(x0)},0)"><line class="domain" y1="${n(a)}" y2="${n(b)}"/>${marks}<text class="axis-label" transform="translate(${-f.margin.left + 16},${n(mid)}) rotate(-90)" text-anchor="middle">${esc(label)}</text></g>`;
}

function svg(cls: string, title: string, f: Frame, body: string): string {
  return `<svg class="chart ${cls}" role="img" aria-label="${esc(title)}" viewBox="0 0 ${f.width} ${f.height}" width="${f.width}" height="${f.height}" xmlns="http://www.w3.org/2000/svg"><title>${esc(title)}</title>${body}</svg>`;
}

function pad([a, b]: [number, number], frac = 0.06): [number, number] {
  if (a === b) return [a - Math.max(1, Math.abs(a) * 0.1), b + Math.max(1, Math.abs(b) * 0.1)];
  const d = (b - a) * frac;
  return [a - d, b + d];
}

function extent(vs: readonly number[]): [number, number] {
  return [Math.min(...vs), Math.max(...vs)];
}

/** Pareto front: overall depth h (mm) against mass (kg), points and the step line of the front. */
export function paretoChart(points: readonly { depth: number; mass: number; governing?: string }[], opts: { title: string; lightest?: { depth: number; mass: number } | null } = { title: 'Pareto front' }, f: Frame = FRAME): string {
  const m = f.margin;
  if (points.length === 0) {
    return svg('pareto empty', opts.title, f, `<text class="empty" x="${f.width / 2}" y="${f.height / 2}" text-anchor="middle">no feasible section</text>`);
  }
  const pts = [...points].sort((a, b) => a.depth - b.depth);
  const x = scaleLinear().domain(pad(extent(pts.map((p) => p.depth)))).nice().range([m.left, f.width - m.right]);
  const y = scaleLinear().domain(pad(extent(pts.map((p) => p.mass)))).nice().range([f.height - m.bottom, m.top]);
  const path = line<{ depth: number; mass: number }>()
    .x((p) => x(p.depth))
    .y((p) => y(p.mass))
    .curve(curveStepAfter)(pts);
  const dots = pts
    .map((p) => {
      const hit = opts.lightest && p.depth === opts.lightest.depth && p.mass === opts.lightest.mass;
      return `<circle class="point${hit ? ' lightest' : ''}" cx="${n(x(p.depth))}" cy="${n(y(p.mass))}" r="${hit ? 5.5 : 4}"><title>h = ${esc(fmt(p.depth))} mm, ${esc(fmt(p.mass))} kg${p.governing ? `, governing: ${esc(p.governing)}` : ''}</title></circle>`;
    })
    .join('');
  const body = `${xAxis(x, f.height - m.bottom, 'overall depth h (mm)', f)}${yAxis(y, m.left, 'mass per girder (kg)', f)}<path class="step" d="${path ?? ''}"/>${dots}`;
  return svg('pareto', opts.title, f, body);
}

/** Horizontal bars of check utilisations (-), with the limit 1.0 marked. */
export function utilisationChart(checks: readonly { id: string; utilisation: number | null; passes: boolean }[], opts: { title: string }, f0: Frame = FRAME): string {
  const rows = checks.filter((c) => c.utilisation !== null) as { id: string; utilisation: number; passes: boolean }[];
  const f: Frame = { ...f0, height: Math.max(120, f0.margin.top + f0.margin.bottom + 24 * rows.length), margin: { ...f0.margin, left: 170 } };
  const m = f.margin;
  if (rows.length === 0) return svg('utilisation empty', opts.title, f, `<text class="empty" x="${f.width / 2}" y="${f.height / 2}" text-anchor="middle">no utilisations</text>`);
  const x = scaleLinear()
    .domain([0, Math.max(1.2, ...rows.map((r) => r.utilisation))])
    .nice()
    .range([m.left, f.width - m.right]);
  const band = (f.height - m.top - m.bottom) / rows.length;
  const bars = rows
    .map((r, i) => {
      const y0 = m.top + i * band;
      const w = Math.max(0, x(r.utilisation) - x(0));
      return `<g class="bar-row"><text class="bar-label" x="${m.left - 8}" y="${n(y0 + band / 2)}" dy="0.32em" text-anchor="end">${esc(r.id)}</text><rect class="bar ${r.passes ? 'pass' : 'fail'}" x="${n(x(0))}" y="${n(y0 + band * 0.15)}" width="${n(w)}" height="${n(band * 0.7)}"><title>${esc(r.id)}: ${r.utilisation.toFixed(3)}</title></rect><text class="bar-value" x="${n(x(0) + w + 4)}" y="${n(y0 + band / 2)}" dy="0.32em">${r.utilisation.toFixed(2)}</text></g>`;
    })
    .join('');
  const limit = `<line class="limit" x1="${n(x(1))}" x2="${n(x(1))}" y1="${m.top}" y2="${f.height - m.bottom}"/>`;
  return svg('utilisation', opts.title, f, `${xAxis(x, f.height - m.bottom, 'utilisation (-)', f, 6)}${bars}${limit}`);
}

/**
 * A design-effect envelope along the girder (x in mm) against resistances drawn as horizontal
 * lines (±R for moments, since sagging and hogging both occur). Values in the caller's units.
 */
export function envelopeChart(
  x: readonly number[],
  values: readonly number[],
  resistances: readonly { name: string; value: number }[],
  opts: { title: string; yLabel: string; symmetric: boolean },
  f: Frame = FRAME,
): string {
  const m = f.margin;
  if (x.length === 0 || x.length !== values.length) return svg('envelope empty', opts.title, f, `<text class="empty" x="${f.width / 2}" y="${f.height / 2}" text-anchor="middle">no stations</text>`);
  const rs = resistances.filter((r) => Number.isFinite(r.value));
  const lo = Math.min(0, ...values, ...(opts.symmetric ? rs.map((r) => -Math.abs(r.value)) : []));
  const hi = Math.max(0, ...values, ...rs.map((r) => Math.abs(r.value)));
  const sx = scaleLinear().domain(extent(x)).range([m.left, f.width - m.right]);
  const sy = scaleLinear().domain(pad([lo, hi], 0.04)).nice().range([f.height - m.bottom, m.top]);
  const pts = x.map((xi, i) => [xi, values[i]!] as [number, number]);
  const d = line<[number, number]>()
    .x((p) => sx(p[0]))
    .y((p) => sy(p[1]))(pts);
  const res = rs
    .flatMap((r, k) => {
      const ys = opts.symmetric ? [Math.abs(r.value), -Math.abs(r.value)] : [Math.abs(r.value)];
      return ys.map(
        (v, s) =>
          `<g class="resistance r${k}"><line x1="${m.left}" x2="${f.width - m.right}" y1="${n(sy(v))}" y2="${n(sy(v))}"/>${s === 0 ? `<text x="${k % 2 === 0 ? f.width - m.right - 4 : m.left + 4}" y="${n(sy(v) - 4)}" text-anchor="${k % 2 === 0 ? 'end' : 'start'}">${esc(r.name)} = ${esc(fmt(r.value))}</text>` : ''}</g>`,
      );
    })
    .join('');
  const zero = `<line class="zero" x1="${m.left}" x2="${f.width - m.right}" y1="${n(sy(0))}" y2="${n(sy(0))}"/>`;
  const dots = pts.map((p) => `<circle class="station" cx="${n(sx(p[0]))}" cy="${n(sy(p[1]))}" r="1.6"/>`).join('');
  return svg('envelope', opts.title, f, `${xAxis(sx, f.height - m.bottom, 'x along the girder (mm)', f)}${yAxis(sy, m.left, opts.yLabel, f)}${zero}${res}<path class="effect" d="${d ?? ''}"/>${dots}`);
}

/** One line of a multi-line chart: y at each x, drawn in its own class (`s0`, `s1`, …). */
export interface Series {
  name: string;
  y: readonly number[];
}

/**
 * Several quantities along the girder (x in mm) on one pair of axes: the moment or shear
 * envelope (the largest and the least over the combinations), or utilisations; optional
 * horizontal reference lines (e.g. the utilisation limit 1.0) and marks at single points
 * (e.g. a check's governing station). A legend names each line. Values in the caller's units.
 */
export function linesChart(
  x: readonly number[],
  series: readonly Series[],
  opts: { title: string; yLabel: string; refs?: readonly { name: string; value: number }[]; marks?: readonly { x: number; y: number; label: string }[]; fill?: boolean },
  f: Frame = FRAME,
): string {
  const m = f.margin;
  const ok = series.filter((s) => s.y.length === x.length && x.length > 0);
  if (ok.length === 0) return svg('lines empty', opts.title, f, `<text class="empty" x="${f.width / 2}" y="${f.height / 2}" text-anchor="middle">no stations</text>`);
  const refs = (opts.refs ?? []).filter((r) => Number.isFinite(r.value));
  const marks = (opts.marks ?? []).filter((p) => Number.isFinite(p.x) && Number.isFinite(p.y));
  const ys = [0, ...ok.flatMap((s) => s.y.filter(Number.isFinite)), ...refs.map((r) => r.value), ...marks.map((p) => p.y)];
  const sx = scaleLinear().domain(extent(x)).range([m.left, f.width - m.right]);
  const sy = scaleLinear().domain(pad(extent(ys), 0.05)).nice().range([f.height - m.bottom, m.top]);
  const paths = ok
    .map((s, k) => {
      const pts = x.map((xi, i) => [xi, s.y[i]!] as [number, number]).filter((p) => Number.isFinite(p[1]));
      const d = line<[number, number]>()
        .x((p) => sx(p[0]))
        .y((p) => sy(p[1]))(pts);
      const area = opts.fill ? `<path class="area s${k}" d="M${n(sx(pts[0]![0]))},${n(sy(0))}L${(d ?? '').slice(1)}L${n(sx(pts[pts.length - 1]![0]))},${n(sy(0))}Z"/>` : '';
      return `${area}<path class="series s${k}" d="${d ?? ''}"><title>${esc(s.name)}</title></path>`;
    })
    .join('');
  const refLines = refs
    .map((r) => `<g class="ref"><line x1="${m.left}" x2="${f.width - m.right}" y1="${n(sy(r.value))}" y2="${n(sy(r.value))}"/><text x="${f.width - m.right - 4}" y="${n(sy(r.value) - 4)}" text-anchor="end">${esc(r.name)}</text></g>`)
    .join('');
  const dots = marks.map((p) => `<g class="mark"><circle cx="${n(sx(p.x))}" cy="${n(sy(p.y))}" r="3.5"/><title>${esc(p.label)}</title></g>`).join('');
  const legend = ok
    .map((s, k) => `<g class="legend-item" transform="translate(${m.left + 8 + k * 150},${m.top + 2})"><line class="series s${k}" x1="0" x2="18" y1="0" y2="0"/><text x="22" dy="0.32em">${esc(s.name)}</text></g>`)
    .join('');
  const zero = `<line class="zero" x1="${m.left}" x2="${f.width - m.right}" y1="${n(sy(0))}" y2="${n(sy(0))}"/>`;
  return svg('lines', opts.title, f, `${xAxis(sx, f.height - m.bottom, 'x along the girder (mm)', f)}${yAxis(sy, m.left, opts.yLabel, f)}${zero}${paths}${refLines}${dots}<g class="legend">${legend}</g>`);
}

/** Plates of a welded I-section, mm (hw clear between the flanges). */
export interface IPlates {
  hw: number;
  tw: number;
  bTop: number;
  tTop: number;
  bBot: number;
  tBot: number;
}

/**
 * The cross-section drawn to scale with its dimensions (mm): flange widths above and below,
 * overall depth h and clear web depth hw on the left, plate thicknesses on the right. Plates
 * thinner than 2 px at the drawing's scale are drawn 2 px thick so they stay visible (the
 * dimension text gives the true value); the elastic neutral axis as a dash-dot line.
 */
export function sectionDrawing(p: IPlates, opts: { title: string; zElastic?: number }, f: Frame = { width: 360, height: 360, margin: { top: 34, right: 96, bottom: 34, left: 96 } }): string {
  const m = f.margin;
  const h = p.hw + p.tTop + p.tBot;
  const b = Math.max(p.bTop, p.bBot);
  const s = Math.min((f.width - m.left - m.right) / b, (f.height - m.top - m.bottom) / h);
  const cx = m.left + (f.width - m.left - m.right) / 2;
  const y0 = m.top + (f.height - m.top - m.bottom - h * s) / 2;
  const t = (v: number) => Math.max(2, v * s);
  const yTop = y0;
  const yWeb0 = y0 + t(p.tTop);
  const yBot = y0 + h * s - t(p.tBot);
  const yEnd = y0 + h * s;
  const rect = (x: number, y: number, w: number, hh: number, cls: string) => `<rect class="plate ${cls}" x="${n(x)}" y="${n(y)}" width="${n(w)}" height="${n(hh)}"/>`;
  const plates =
    rect(cx - (p.bTop * s) / 2, yTop, p.bTop * s, t(p.tTop), 'top') +
    rect(cx - t(p.tw) / 2, yWeb0, t(p.tw), yBot - yWeb0, 'web') +
    rect(cx - (p.bBot * s) / 2, yBot, p.bBot * s, t(p.tBot), 'bottom');
  const dimH = (x1: number, x2: number, y: number, label: string, above: boolean) =>
    `<g class="dim"><line x1="${n(x1)}" x2="${n(x2)}" y1="${n(y)}" y2="${n(y)}"/><line x1="${n(x1)}" x2="${n(x1)}" y1="${n(y - 4)}" y2="${n(y + 4)}"/><line x1="${n(x2)}" x2="${n(x2)}" y1="${n(y - 4)}" y2="${n(y + 4)}"/><text x="${n((x1 + x2) / 2)}" y="${n(above ? y - 6 : y + 14)}" text-anchor="middle">${esc(label)}</text></g>`;
  const dimV = (x: number, y1: number, y2: number, label: string, dy: number) =>
    `<g class="dim"><line x1="${n(x)}" x2="${n(x)}" y1="${n(y1)}" y2="${n(y2)}"/><line x1="${n(x - 4)}" x2="${n(x + 4)}" y1="${n(y1)}" y2="${n(y1)}"/><line x1="${n(x - 4)}" x2="${n(x + 4)}" y1="${n(y2)}" y2="${n(y2)}"/><text x="${n(x - 4)}" y="${n((y1 + y2) / 2 + dy)}" dy="0.32em" text-anchor="end">${esc(label)}</text></g>`;
  const note = (x: number, y: number, label: string) => `<text class="dim-note" x="${n(x)}" y="${n(y)}" dy="0.32em">${esc(label)}</text>`;
  const xl = cx - (b * s) / 2;
  const xr = cx + (b * s) / 2;
  const dims =
    dimH(cx - (p.bTop * s) / 2, cx + (p.bTop * s) / 2, yTop - 12, `bf,top = ${p.bTop}`, true) +
    dimH(cx - (p.bBot * s) / 2, cx + (p.bBot * s) / 2, yEnd + 12, `bf,bot = ${p.bBot}`, false) +
    dimV(xl - 44, yTop, yEnd, `h = ${h}`, -12) +
    dimV(xl - 10, yWeb0, yBot, `hw = ${p.hw}`, 12) +
    note(xr + 8, yTop + t(p.tTop) / 2, `tf,top = ${p.tTop}`) +
    note(xr + 8, yBot + t(p.tBot) / 2, `tf,bot = ${p.tBot}`) +
    note(cx + t(p.tw) / 2 + 6, (yWeb0 + yBot) / 2 - 14, `tw = ${p.tw}`);
  const na = opts.zElastic !== undefined ? `<line class="na" x1="${n(xl - 6)}" x2="${n(xr + 6)}" y1="${n(yEnd - opts.zElastic * s)}" y2="${n(yEnd - opts.zElastic * s)}"><title>elastic neutral axis, ${esc(fmt(opts.zElastic))} mm above the underside</title></line>` : '';
  return svg('section', opts.title, f, `${plates}${na}${dims}`);
}
