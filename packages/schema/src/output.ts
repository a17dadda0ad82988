import { CHECKS, type CheckId, type CheckResult, type GirderVerdict, type ReportedUnit } from '@platesmith/checks';
import { convertValue, type ValueUnit } from './units.js';

/** The published unit of each unit the check library reports in (the registry's `values`). */
const PUBLIC_UNIT: Record<Exclude<ReportedUnit, 'text'>, ValueUnit> = {
  N: 'kN',
  Nmm: 'kNm',
  'N/mm': 'kN/m',
  mm: 'mm',
  mm2: 'mm2',
  mm3: 'mm3',
  mm4: 'mm4',
  MPa: 'MPa',
  '-': '-',
};

/**
 * Units of the numeric `values` keys as published, per check id, derived from the check registry:
 * forces kN, moments kNm, lengths mm, areas mm², moduli mm³, second moments mm⁴, stresses MPa,
 * line forces kN/m (= N/mm), ratios '-'. The registry's test fails on a key a check reports that
 * its entry does not declare.
 */
export const VALUE_UNITS: Readonly<Record<CheckId, Readonly<Record<string, ValueUnit>>>> = Object.fromEntries(
  CHECKS.map((c) => [c.id, Object.fromEntries(Object.entries(c.values as Record<string, ReportedUnit>).flatMap(([k, u]) => (u === 'text' ? [] : [[k, PUBLIC_UNIT[u]]])))]),
) as Record<CheckId, Record<string, ValueUnit>>;

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
      const unit = VALUE_UNITS[c.id]?.[k] ?? '-';
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
}

export function publishVerdict(v: GirderVerdict): PublishedVerdict {
  return { passes: v.passes, governing: publishCheck(v.governing), checks: v.checks.map(publishCheck) };
}
