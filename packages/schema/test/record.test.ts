/**
 * The data of a calculation record (publishRecord) against closed forms: the gross section
 * properties of a doubly symmetric welded I (A = 2 b tf + hw tw, Iy = tw hw³/12 + 2 b tf (hw/2 +
 * tf/2)² + 2 b tf³/12: the parallel-axis theorem, any structural handbook), the design reactions
 * of a simply supported girder under a uniform load (R = w L / 2, the same), and the record's own
 * consistency with the check it prints (the largest bending utilisation along the span is the
 * bending check's). Invented girder; tolerances are floating point only unless said.
 */
import { describe, expect, test } from 'vitest';
import { parseRecordRequest, publishRecord } from '../src/index.js';

const SECTION = { web: { depth: 1000, thickness: 10 }, topFlange: { width: 300, thickness: 20 }, bottomFlange: { width: 300, thickness: 20 }, endPost: 'rigid', grade: 'S355' };
const G = 10; // kN/m
const Q = 15; // kN/m, category B: ψ0 0.7 (EN 1990 Table A1.1)
const L = 12000;

function record(extra: Record<string, unknown> = {}) {
  const r = parseRecordRequest({ spans: [L], actions: [{ kind: 'permanent', load: 'udl', value: G }, { kind: 'variable', load: 'udl', value: Q, category: 'B' }], section: SECTION, options: { restraint: { spacing: 3000 } }, ...extra });
  if (!r.ok) throw new Error(JSON.stringify(r.issues));
  return publishRecord(r.value.check, r.value.raw, r.value.title);
}

describe('calculation record data', () => {
  const d = record({ title: { project: 'P', mark: 'M' } });

  test('gross properties equal the closed forms of a doubly symmetric I', () => {
    const [hw, tw, b, tf] = [1000, 10, 300, 20];
    const A = 2 * b * tf + hw * tw;
    const Iy = (tw * hw ** 3) / 12 + 2 * (b * tf * (hw / 2 + tf / 2) ** 2 + (b * tf ** 3) / 12);
    // the record publishes 5 significant figures
    expect(d.section.properties.A).toBe(A);
    expect(Math.abs(d.section.properties.Iy / Iy - 1)).toBeLessThan(5e-5);
    expect(d.section.properties.zElastic).toBe(hw / 2 + tf);
    expect(d.section.properties.h).toBe(hw + 2 * tf);
  });

  test('design reactions: R = w L / 2 with w = 1.35 (G + g) + 1.5 Q (EN 1990 eq. 6.10, recommended factors)', () => {
    const g = d.basis.selfWeight!; // kN/m, the section's own weight (the record says it)
    const w = 1.35 * (G + g) + 1.5 * Q;
    for (const r of d.analysis.reactions) expect(Math.abs(r.R / ((w * L) / 1000 / 2) - 1)).toBeLessThan(5e-5);
    // self-weight of web and flanges at 7850 kg/m³ and g = 9.80665 m/s² (no stiffeners)
    expect(Math.abs(g / ((2 * 300 * 20 + 1000 * 10) * 1e-6 * 7850 * 9.80665 * 1e-3) - 1)).toBeLessThan(5e-5);
  });

  test('the largest bending utilisation along the span is the bending check’s; ψ by category printed', () => {
    const bending = d.verdict.checks.find((c) => c.id === 'bending')!;
    const top = Math.max(...d.alongSpan.map((p) => p.bending));
    expect(Math.abs(top - bending.utilisation!)).toBeLessThanOrEqual(1e-4);
    expect(d.basis.actions[1]).toMatchObject({ category: 'B', psi0: 0.7, psi1: 0.5, psi2: 0.3, psiSource: 'EN 1990 Table A1.1, category B' });
  });

  test('title block as given, blank (null) where not; the hash ignores key order and the title', () => {
    expect(d.title).toEqual({ project: 'P', mark: 'M', revision: null, preparedBy: null, checkedBy: null, date: null });
    const again = record({ title: { project: 'other' } });
    expect(again.inputHash).toBe(d.inputHash);
    const changed = record({ options: { restraint: { spacing: 2000 } } });
    expect(changed.inputHash).not.toBe(d.inputHash);
  });

  test('every default taken is listed; an option given is not', () => {
    expect(d.basis.assumptions).toEqual(expect.arrayContaining([expect.stringMatching(/^partial factors: the "buildings" set/), expect.stringMatching(/^bottom flange restraint: at the supports only/)]));
    expect(d.basis.assumptions.some((a) => a.startsWith('top flange restraint'))).toBe(false);
  });
});
