/**
 * @platesmith/report — human-readable output of a schedule: one self-contained HTML file with
 * SVG charts drawn here (d3-scale for scales and ticks, d3-shape for paths).
 */
export { renderReport, markFromSearch } from './report.js';
export { paretoChart, utilisationChart, envelopeChart, type Frame } from './charts.js';
export { esc } from './html.js';
export type { ReportInput, ReportMark, ReportCheck, ReportTonnage, ReportRationalisation } from './types.js';
export { scheduleReport } from './schedule.js';
