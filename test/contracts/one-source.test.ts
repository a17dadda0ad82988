import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, test } from 'vitest';
import { G_ACC, STEEL_DENSITY, STEEL_KG_PER_MM3 } from '@platesmith/catalogue';

/**
 * One source for the physical constants every mass and self-weight depends on. A bound computed
 * with another copy of ρ or g than the value it bounds could exceed it by a unit in the last place
 * and drop an answer; so the source code holds each literal once, in the catalogue.
 * Sources: standard acceleration of gravity 9.80665 m/s² (CGPM 1901, exact by definition); steel
 * 7850 kg/m³ (EN 1991-1-1:2002 Table A.4 gives 77.0–78.5 kN/m³ for steel, from memory; 7850 kg/m³
 * is common practice).
 */
const ROOT = fileURLToPath(new URL('../../', import.meta.url));

function sources(dir: string): string[] {
  const out: string[] = [];
  for (const name of readdirSync(dir)) {
    const p = join(dir, name);
    if (name === 'node_modules' || name === 'dist') continue;
    if (statSync(p).isDirectory()) out.push(...sources(p));
    else if (name.endsWith('.ts')) out.push(p);
  }
  return out;
}

/** The code of a TypeScript file without its comments (block and line comments; good enough for a literal scan). */
function code(text: string): string {
  // block comments keep their line breaks, so the line numbers reported stay the file's
  return text.replace(/\/\*[\s\S]*?\*\//g, (c) => c.replace(/[^\n]/g, '')).replace(/(^|[^:'"`])\/\/.*$/gm, '$1');
}

describe('one source for ρ and g', () => {
  test('the catalogue\'s values', () => {
    expect(G_ACC).toBe(9.80665);
    expect(STEEL_DENSITY).toBe(7850);
    expect(Math.abs(STEEL_KG_PER_MM3 / 7.85e-6 - 1)).toBeLessThan(1e-15);
  });

  test('no source file outside the catalogue writes the density or g as a literal', () => {
    const dirs = ['packages', 'services', 'bench'].map((d) => join(ROOT, d));
    const files = dirs.flatMap(sources).filter((f) => f.includes(`${join('src', '')}`) || f.includes(join('bench', '')));
    const offenders: string[] = [];
    for (const f of files) {
      const rel = relative(ROOT, f);
      if (rel.startsWith(join('packages', 'catalogue', 'src'))) continue;
      if (rel.includes(`${join('', 'test', '')}`)) continue;
      const lines = code(readFileSync(f, 'utf8')).split('\n');
      lines.forEach((line, i) => {
        if (/(?<![\w.])(7850(?:e-?\d+)?|7\.85e-?\d+|9\.80665|9\.81)(?![\w.])/.test(line)) offenders.push(`${rel}:${i + 1}: ${line.trim()}`);
      });
    }
    expect(files.length).toBeGreaterThan(50);
    expect(offenders).toEqual([]);
  });
});
