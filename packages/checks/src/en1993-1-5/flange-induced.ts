import type { FlangeSide } from '../section.js';
import type { CheckContext, CheckResult, CheckValue } from '../types.js';
import { governs, verdict } from '../result.js';
import type { SignBending } from '../en1993-1-1/bending.js';

/**
 * Flange-induced buckling, EN 1993-1-5:2006 8(1) eq. 8.1: hw/tw ≤ k (E/fyf) √(Aw/Afc).
 * hw, tw mm; E, fyf MPa; Aw = hw tw and Afc (effective area of the compression flange) mm².
 * k = 0.3 (plastic rotation used), 0.4 (plastic moment resistance used), 0.55 (elastic moment resistance used).
 */
export function fibLimit(p: { k: number; E: number; fyf: number; Aw: number; Afc: number }): number {
  return ((p.k * p.E) / p.fyf) * Math.sqrt(p.Aw / p.Afc);
}

/** 'auto' k of the options: 0.4 when the bending resistance used is plastic (Class 1–2), else 0.55. */
export function kFibFor(kOpt: number | 'auto', plasticUsed: boolean): number {
  if (kOpt !== 'auto') return kOpt;
  return plasticUsed ? 0.4 : 0.55;
}

/** The largest k the check may use with this option, whichever resistance it uses (for a bound). */
export function kFibMax(kOpt: number | 'auto'): number {
  return Math.max(kFibFor(kOpt, true), kFibFor(kOpt, false));
}

/**
 * 'flange-induced-buckling' for each sign of moment that occurs (compression flange `side`).
 * Afc is the gross area for a flange that is not Class 4 and bEff·tf otherwise (EN 1993-1-5 4.4).
 * utilisation = (hw/tw) / limit, the worse sign governs.
 */
export function flangeInducedCheck(ctx: CheckContext, per: ReadonlyMap<FlangeSide, SignBending>): CheckResult {
  const { s, m, o } = ctx;
  const ratio = s.hw / s.tw;
  let best: { u: number; values: Record<string, CheckValue> } | null = null;
  for (const [side, b] of per) {
    const flange = side === 'top' ? s.top : s.bot;
    const fyf = side === 'top' ? m.fyTop : m.fyBot;
    const bEff = b.eff ? b.eff.bEffFlange : flange.b;
    const Afc = bEff * flange.t;
    const k = kFibFor(o.kFib, b.plastic);
    const limit = fibLimit({ k, E: o.E, fyf, Aw: s.hw * s.tw, Afc });
    const u = ratio / limit;
    if (governs(u, best?.u)) {
      best = {
        u,
        values: {
          ratio,
          limit,
          k,
          kBasis: o.kFib === 'auto' ? (b.plastic ? 'auto: plastic moment resistance used (0.4)' : 'auto: elastic moment resistance used (0.55)') : 'given',
          Afc,
          fyf,
          sign: side === 'top' ? 'sagging' : 'hogging',
        },
      };
    }
  }
  return verdict('flange-induced-buckling', 'EN 1993-1-5 8', best!.u, null, best!.values);
}
