import { describe, expect, test } from 'vitest';
import { DomainError, bandEdges, fy, fyMax, maxThickness } from '../src/index.js';

function thrown(f: () => unknown): unknown {
  let caught: unknown = undefined;
  let threw = false;
  try {
    f();
  } catch (e) {
    threw = true;
    caught = e;
  }
  expect(threw, 'expected the call to throw').toBe(true);
  return caught;
}

describe('lookups and errors', () => {
  test('band edge belongs to the thinner band (t = 16.0 mm uses the t <= 16 value)', () => {
    // EN 10025-2 Table 7 bands are "nominal thickness <= 16", "> 16 <= 40"; the SBE and SDM
    // worked pages apply them this way (tf 19.6 mm S275 → 265; tmax 13.5 mm S235 → 235).
    expect(fy('S355', 16)).toBe(355);
    expect(fy('S355', 16.01)).toBe(345);
  });

  test('unknown grade names the grade and lists the known ones', () => {
    const err = thrown(() => fy('S999', 10, 'product', 'section.grade'));
    expect(err).toBeInstanceOf(DomainError);
    expect((err as DomainError).toJSON()).toEqual({
        code: 'UNKNOWN_GRADE',
        message: 'unknown steel grade "S999"',
        hint: 'use one of S235, S275, S355, S420, S460',
        field: 'section.grade',
        data: { grade: 'S999' },
    });
  });

  test('thickness outside the standard names grade and thickness', () => {
    expect(() => fy('S355', 151)).toThrow('S355 plate 151 mm thick is outside EN 10025-2 (0 < t <= 150 mm)');
    expect(() => fy('S355', 0)).toThrow(/S355 plate 0 mm/);
    expect(() => fy('S355', Number.NaN)).toThrow(DomainError);
    expect(() => fy('S355', 90, 'table3.1')).toThrow(/EN 1993-1-1 Table 3.1 \(0 < t <= 80 mm\)/);
  });

  test('helpers for pruning', () => {
    expect(fyMax('S355')).toBe(355);
    expect(maxThickness('S460')).toBe(120);
    expect(bandEdges('S275')).toEqual([16, 40, 63, 80, 100, 150]);
  });
});
