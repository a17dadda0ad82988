/** Plain-text table with right-aligned numeric columns. */
export function table(head: string[], rows: (string | number)[][], align: ('l' | 'r')[] = []): string {
  const cells = [head, ...rows.map((r) => r.map(String))];
  const w = head.map((_, i) => Math.max(...cells.map((r) => (r[i] ?? '').length)));
  const line = (r: string[]) =>
    r
      .map((c, i) => ((align[i] ?? 'l') === 'r' ? c.padStart(w[i]!) : c.padEnd(w[i]!)))
      .join('  ')
      .trimEnd();
  return [line(head), w.map((n) => '-'.repeat(n)).join('  '), ...cells.slice(1).map(line)].join('\n');
}

export function fmt(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e6 || a < 1e-3)) return v.toExponential(3);
  return Number(v.toPrecision(Math.max(digits, Math.ceil(Math.log10(a + 1)) ))).toString();
}

/** [#####.....] 12/40 */
export function progressBar(done: number, total: number, width = 24): string {
  const n = total > 0 ? Math.round((done / total) * width) : width;
  return `[${'#'.repeat(n)}${'.'.repeat(width - n)}] ${done}/${total}`;
}
