import type { SectionJson } from '@platesmith/schema';

/** The plates of a section in words an estimator reads (never an internal key). Dimensions mm. */
export function sectionInWords(s: SectionJson): string {
  const fl = (f: { width: number; thickness: number }) => `${f.width} × ${f.thickness}`;
  const same = s.topFlange.width === s.bottomFlange.width && s.topFlange.thickness === s.bottomFlange.thickness;
  const flanges = same ? `flanges ${fl(s.topFlange)}` : `top flange ${fl(s.topFlange)}, bottom flange ${fl(s.bottomFlange)}`;
  const st = s.stiffeners ? `stiffeners ${s.stiffeners.width} × ${s.stiffeners.thickness} at ${s.stiffeners.spacing}${s.stiffeners.sides === 1 ? ' one side' : ''}` : 'no intermediate stiffeners';
  const gs = s.grade ?? 'S355';
  const grade = typeof gs === 'string' ? gs : `web ${gs.web}, flanges ${gs.flanges}`;
  return `web ${s.web.depth} × ${s.web.thickness}, ${flanges}, ${st}, ${s.endPost ?? 'rigid'} end post, ${grade}`;
}

/**
 * A rationalisation candidate's key (the schedule package's sectionKey:
 * `hw x tw | bt x tt | bb x tb | stiffeners | end post | bearing | grade`) in words; a key of
 * another form is returned as it is.
 */
export function sectionKeyInWords(key: string): string {
  const p = key.split('|');
  if (p.length !== 7) return key;
  const [web, top, bot, st, endPost, bearing, grade] = p as [string, string, string, string, string, string, string];
  const x = (s: string) => s.replace(/x/g, ' × ');
  const flanges = top === bot ? `flanges ${x(top)}` : `top flange ${x(top)}, bottom flange ${x(bot)}`;
  const m = /^a([\d.]+)-(\d)x([\d.]+)x([\d.]+)$/.exec(st);
  const stiff = st === 'none' ? 'no intermediate stiffeners' : m ? `stiffeners ${m[3]} × ${m[4]} at ${m[1]}${m[2] === '1' ? ' one side' : ''}` : st;
  const br = bearing === 'auto' ? '' : `, bearing flats ${x(bearing.replace(/e[\d.]+$/, ''))}`;
  return `web ${x(web)}, ${flanges}, ${stiff}, ${endPost} end post${br}, ${grade.replace(/\//g, ' / ')}`;
}

/** The plate list as CSV (RFC 4180: comma separated, quoted where needed, CRLF line ends); masses kg, lengths mm. */
export function plateListCsv(plates: readonly { kind: string; grade: string; thickness: number; width: number; length: number; count: number; unitMass?: number; mass: number; marks: readonly string[]; parts?: readonly string[] }[]): string {
  const q = (v: string | number) => {
    const s = String(v);
    return /[",\r\n]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
  };
  const head = ['product', 'grade', 'thickness_mm', 'width_mm', 'length_mm', 'count', 'unit_mass_kg', 'mass_kg', 'marks', 'parts'];
  const rows = plates.map((p) => [p.kind === 'plate' ? 'plate' : 'flat bar', p.grade, p.thickness, p.width, p.length, p.count, p.unitMass === undefined ? '' : p.unitMass.toFixed(1), p.mass.toFixed(1), p.marks.join(' '), (p.parts ?? []).join(' ')]);
  return [head, ...rows].map((r) => r.map(q).join(',')).join('\r\n') + '\r\n';
}
