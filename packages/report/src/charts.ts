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
