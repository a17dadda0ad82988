/** Text tables fit this many columns unless --wide asks for every column at full width. */
export const TABLE_WIDTH = 120;

/**
 * Plain-text table with right-aligned numeric columns. With `max`, the widest left-aligned
 * column is cut (ending in …) until the lines fit `max` characters.
 */
export function table(head: string[], rows: (string | number)[][], align: ('l' | 'r')[] = [], max = Infinity): string {
  const cells = [head, ...rows.map((r) => r.map(String))];
  const w = head.map((_, i) => Math.max(...cells.map((r) => (r[i] ?? '').length)));
  const total = () => w.reduce((s, x) => s + x, 0) + 2 * (w.length - 1);
  while (total() > max) {
    let k = -1;
    for (let i = 0; i < w.length; i++) if ((align[i] ?? 'l') === 'l' && w[i]! > head[i]!.length && (k < 0 || w[i]! > w[k]!)) k = i;
    if (k < 0) break;
    w[k] = Math.max(head[k]!.length, w[k]! - (total() - max));
  }
  const cut = (c: string, n: number) => (c.length <= n ? c : `${c.slice(0, Math.max(0, n - 1))}…`);
  const line = (r: string[]) =>
    r
      .map((c0, i) => {
        const c = cut(c0, w[i]!);
        return (align[i] ?? 'l') === 'r' ? c.padStart(w[i]!) : c.padEnd(w[i]!);
      })
      .join('  ')
      .trimEnd();
  return [line(head), w.map((n) => '-'.repeat(n)).join('  '), ...cells.slice(1).map(line)].join('\n');
}

/** A number for text: `digits` significant figures, integers whole, exponents only beyond 1e12. */
export function fmt(v: number, digits = 3): string {
  if (!Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a !== 0 && (a >= 1e12 || a < 1e-3)) return v.toExponential(3);
  if (Number.isInteger(v)) return String(v);
  return Number(v.toPrecision(Math.max(digits, Math.ceil(Math.log10(a + 1))))).toString();
}

/** A count as a plain integer with thousands grouped by a thin space (64 300, not 6.43e+4). */
export function count(v: number): string {
  return Math.round(v).toLocaleString('en-GB').replace(/,/g, ' ');
}

/** [#####.....] 12/40 */
export function progressBar(done: number, total: number, width = 24): string {
  const n = total > 0 ? Math.round((done / total) * width) : width;
  return `[${'#'.repeat(n)}${'.'.repeat(width - n)}] ${done}/${total}`;
}
