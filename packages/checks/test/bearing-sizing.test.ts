import { describe, expect, test } from 'vitest';
import { fy } from '@platesmith/catalogue';
import { BEARING_MAX_PAIRS, bearingColumnSection, bearingFlatArea, bearingOptions, stiffenerSection, checkGirder, defaultOptions, flatTorsion, type Effects, type Section } from '../src/index.js';
import { effectsOf } from './span-effects.js';

/**
 * Issue 17, item 3: every part the tool sizes passes the checks it is subject to. The sizing of
 * bearing stiffeners (sizeBearing) used to fall back, when nothing passed, on the largest stock
 * flat that fits: 300 × 25, whose bs/ts = 12 fails EN 1993-1-5 9.2.1(8) (It/Ip = 0.0069 against
 * 5.3·345/210 000 = 0.0087, utilisation 1.26–1.30 by band) at x = 0. The sections here are
 * invented for the test.
 */
const S355 = { web: 'S355', top: 'S355', bot: 'S355', stiffener: 'S355' } as const;
const wide: Section = { hw: 1500, tw: 12, top: { b: 700, t: 30 }, bot: { b: 700, t: 30 }, stiffeners: null, endPost: 'rigid', grade: S355 };
const L = 12000;
const withReaction = (R: number): Effects => {
  const e = effectsOf(L, 30, 0, true);
  return { ...e, reactions: e.reactions.map((r) => ({ x: r.x, R })) };
};

/** EN 1993-1-5:2006 9.2.1(8) eq. 9.3 for a flat welded along one edge: It/Ip = ts²/(bs² + ts²) ≥ 5.3 fy/E (E = 210 000 MPa, EN 1993-1-1 3.2.6). */
const meetsTorsion = (bs: number, ts: number): boolean => (ts * ts) / (bs * bs + ts * ts) >= (5.3 * fy('S355', ts)) / 210000;

describe('sizeBearing', () => {
  test('under a reaction no option carries, it reports the strongest option that still meets 9.2.1(8), not the widest flat', () => {
    const v = checkGirder(wide, withReaction(1e8), defaultOptions(L));
    expect(v.bearingSized).toBe(true);
    expect(v.passes).toBe(false);
    expect(v.checks.find((c) => c.id === 'bearing-stiffener')!.passes).toBe(false);
    expect(v.checks.find((c) => c.id === 'stiffener-torsion')!.passes).toBe(true);
    expect(meetsTorsion(v.bearing.bs, v.bearing.ts)).toBe(true);
    expect(v.bearing.pairs).toBe(BEARING_MAX_PAIRS);
    // the 300 × 25 flat it used to return fails eq. 9.3
    expect(meetsTorsion(300, 25)).toBe(false);
  });

  test('a reaction one pair of flats carries keeps the lightest such pair (the sizing as before plates were offered)', () => {
    const v = checkGirder(wide, withReaction(3e5), defaultOptions(L));
    expect(v.passes).toBe(true);
    expect(v.bearing.pairs ?? 1).toBe(1);
    expect(defaultOptions(L).bearingFlats.some((f) => f.b === v.bearing.bs && f.t === v.bearing.ts)).toBe(true);
  });

  test('a reaction beyond every pair of flats is carried by plates or several pairs, which pass end post, bearing and torsion', () => {
    // the strongest flat pair, 300 × 25 (fails torsion anyway), crushes at 2·280·25·345 = 4.83 MN (9.4 bearing, γM0 = 1.0)
    const v = checkGirder(wide, withReaction(6e6), defaultOptions(L));
    for (const id of ['end-post', 'bearing-stiffener', 'stiffener-torsion']) expect(v.checks.find((c) => c.id === id)!.passes).toBe(true);
    expect(v.bearing.bs).toBeLessThanOrEqual((700 - 12) / 2);
    expect(meetsTorsion(v.bearing.bs, v.bearing.ts)).toBe(true);
    const b = v.checks.find((c) => c.id === 'bearing-stiffener')!;
    // crushing of n pairs after the 20 mm snipes (9.4, common practice for the snipe): n·2·(bs − 20)·ts·fy/γM0 ≥ R
    expect((v.bearing.pairs ?? 1) * 2 * (v.bearing.bs - 20) * v.bearing.ts * fy('S355', v.bearing.ts)).toBeGreaterThanOrEqual(6e6);
    expect(b.values['pairs']).toBe(v.bearing.pairs ?? 1);
    // and it is the least steel of the options that pass: no option with less bearing steel on the girder
    // (every support's pairs, and the rigid end posts' outer pairs) passes
    const area = bearingFlatArea('rigid', 2, v.bearing);
    let lighterTried = 0;
    for (const f of bearingOptions(defaultOptions(L), 'S355')) {
      if (f.bs > (700 - 12) / 2 || bearingFlatArea('rigid', 2, f) >= area) continue;
      const u = checkGirder({ ...wide, bearing: { bs: f.bs, ts: f.ts, e: v.bearing.e, pairs: f.pairs } }, withReaction(6e6), defaultOptions(L));
      expect(u.checks.filter((c) => c.id === 'end-post' || c.id === 'bearing-stiffener').every((c) => c.passes)).toBe(false);
      lighterTried++;
    }
    expect(lighterTried).toBeGreaterThan(10);
  });

  test('the options meet the torsional requirement by its closed form', () => {
    for (const f of bearingOptions(defaultOptions(L), 'S355')) expect(meetsTorsion(f.bs, f.ts)).toBe(flatTorsion(f.bs, f.ts, fy('S355', f.ts), 210000).ItOverIp >= (5.3 * fy('S355', f.ts)) / 210000);
  });
});

describe('bearingColumnSection (EN 1993-1-5 9.4(2), 9.1(2): the pairs with their web strips as a column)', () => {
  test('one pair is the stiffener section itself; each further pair adds its two flats about the web mid-plane (parallel axes)', () => {
    const one = stiffenerSection(200, 20, 2, 12, 180, 180);
    expect(bearingColumnSection(200, 20, 1, 12, 180, 180)).toEqual({ A: one.A, I: one.I });
    const three = bearingColumnSection(200, 20, 3, 12, 180, 180);
    // elementary mechanics: a flat bs × ts whose centroid is tw/2 + bs/2 from the axis: ts·bs³/12 + bs·ts·(tw/2 + bs/2)²
    const flat = (20 * 200 ** 3) / 12 + 200 * 20 * (6 + 100) ** 2;
    expect(three.A).toBeCloseTo(one.A + 2 * 2 * 200 * 20, 9);
    expect(three.I / (one.I + 2 * 2 * flat)).toBeCloseTo(1, 12);
  });
});
