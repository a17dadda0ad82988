import type { CheckResult, GirderVerdict } from '@platesmith/checks';
import { convertValue, type ValueUnit } from './units.js';
import type { Assumption } from './convert.js';

/**
 * Units of the `values` keys as published. Forces kN, moments kNm, lengths mm, areas mm²,
 * moduli mm³, second moments mm⁴, stresses MPa, line forces kN/m (= N/mm), ratios '-'.
 * A key not listed here is published unconverted and a test fails until it is classified.
 */
export const VALUE_UNITS: Record<string, ValueUnit> = {};

const groups: [ValueUnit, string[]][] = [
  ['kNm', ['MEd', 'MEdVbf', 'McRd', 'MplRd', 'MelRd', 'MeffRd', 'MfRd', 'Mcr', 'McrUniform', 'McrThreeFactor', 'MbRd', 'MyRd', 'MRd', 'MplFlangesRd']],
  ['kN', ['VEd', 'VplRd', 'VbwRd', 'VbfRd', 'VbRd', 'NEd', 'NbRd', 'FRd', 'F', 'FEd', 'R', 'FbRd', 'Fcr', 'Ncr', 'NcrStiff', 'VEdPanel']],
  ['kN/m', ['vEd', 'FwRd', 'FwEd', 'fwEd']],
  ['MPa', ['fy', 'fyw', 'fyf', 'fyTop', 'fyBot', 'fvwd', 'fu', 'fyStiff', 'sigmaEd', 'tauEd']],
  ['mm', ['x0', 'x1', 'a', 'ly', 'le', 'delta', 'limit', 'throat', 'zEff', 'e', 'eMin', 'ss', 'c', 'zg', 'zj', 'Lcr', 'L', 'hw', 'tw', 'span', 'beff', 'bEff', 'b']],
  ['mm2', ['Av', 'Aeff', 'Afc', 'Ast', 'AstMin', 'Abearing', 'A', 'Aw', 'Anet']],
  ['mm3', ['Weff', 'Wel', 'Wpl', 'Wy']],
  ['mm4', ['Ist', 'IstMin', 'Ieff', 'Iy', 'Iz', 'It', 'Ip']],
];
for (const [unit, keys] of groups) for (const k of keys) VALUE_UNITS[k] = unit;

export interface PublishedCheck {
  id: string;
  clause: string;
  applies: boolean;
  reason?: string;
  utilisation: number | null;
  passes: boolean;
  at: number | null;
  values: Record<string, number | string | boolean>;
}

function round(v: number): number {
  if (!Number.isFinite(v)) return v;
  const a = Math.abs(v);
  if (a === 0) return 0;
  const digits = Math.max(0, 5 - Math.ceil(Math.log10(a)));
  const f = 10 ** Math.min(digits, 9);
  return Math.round(v * f) / f;
}

/** A check result in public units; utilisation rounded to 4 decimals, values to 5 significant figures. */
export function publishCheck(c: CheckResult): PublishedCheck {
  const values: Record<string, number | string | boolean> = {};
  for (const [k, v] of Object.entries(c.values)) {
    if (typeof v !== 'number') values[k] = v;
    else {
      const unit = VALUE_UNITS[k] ?? '-';
      values[k] = round(convertValue(unit, v));
    }
  }
  const out: PublishedCheck = {
    id: c.id,
    clause: c.clause,
    applies: c.applies,
    utilisation: Number.isFinite(c.utilisation) ? Math.round(c.utilisation * 1e4) / 1e4 : null,
    passes: c.passes,
    at: c.at,
    values,
  };
  if (c.reason !== undefined) out.reason = c.reason;
  return out;
}

export interface PublishedVerdict {
  passes: boolean;
  governing: PublishedCheck;
  checks: PublishedCheck[];
  /** every default applied to the request (absent when the caller had none to list) */
  assumptions?: Assumption[];
}

export function publishVerdict(v: GirderVerdict, assumptions?: readonly Assumption[]): PublishedVerdict {
  return { passes: v.passes, governing: publishCheck(v.governing), checks: v.checks.map(publishCheck), ...(assumptions ? { assumptions: [...assumptions] } : {}) };
}
