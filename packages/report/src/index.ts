/**
 * @platesmith/report — human-readable output of a schedule: one self-contained HTML file with
 * SVG charts drawn here (d3-scale for scales and ticks, d3-shape for paths).
 */
export { renderReport, markFromSearch } from './report.js';
export { paretoChart, utilisationChart, envelopeChart, linesChart, sectionDrawing, type Frame, type Series, type IPlates } from './charts.js';
export { renderRecord, FORMULAS } from './record.js';
export { htmlToPdf, chromiumPath, PdfUnavailable } from './pdf.js';
export { esc } from './html.js';
export type { ReportInput, ReportMark, ReportCheck, ReportTonnage, ReportRationalisation, ReportReconciliation } from './types.js';
export { scheduleReport } from './schedule.js';
export { sectionInWords, sectionKeyInWords, plateListCsv } from './words.js';
