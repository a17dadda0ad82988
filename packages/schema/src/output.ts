import { CHECKS, type CheckId, type CheckResult, type GirderVerdict, type ReportedUnit } from '@platesmith/checks';
import { convertValue, type ValueUnit } from './units.js';
import type { Assumption } from './convert.js';

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
 * line forces kN/m (= N/mm), ratios '-' (`limit` is a length for deflection, a ratio elsewhere).
 * The registry's test fails on a key a check reports that its entry does not declare.
 */
export const VALUE_UNITS: Readonly<Record<CheckId, Readonly<Record<string, ValueUnit>>>> = Object.fromEntries(
  CHECKS.map((c) => [c.id, Object.fromEntries(Object.entries(c.values as Record<string, ReportedUnit>).flatMap(([k, u]) => (u === 'text' ? [] : [[k, PUBLIC_UNIT[u]]])))]),
) as Record<CheckId, Record<string, ValueUnit>>;

/** A key's unit when every check that reports it agrees (undefined for `limit`, which does not). */
const KEY_UNIT: ReadonlyMap<string, ValueUnit | null> = (() => {
  const m = new Map<string, ValueUnit | null>();
  for (const units of Object.values(VALUE_UNITS) as Record<string, ValueUnit>[]) {
    for (const [k, u] of Object.entries(units)) m.set(k, m.has(k) && m.get(k) !== u ? null : u);
  }
  return m;
})();

/** Suffixes a check adds to a key for one sign or flange (`McRd_sagging`): the unit is the base key's. */
const SUFFIX = /_(sagging|hogging|top|bot|bottom)$/;

/**
 * The published unit of a `values` key of the check `check` (from the check registry), or, with no
 * check, the unit every check that reports the key agrees on (a suffixed key: its base key's);
 * undefined when nobody declared it.
 */
export function unitOf(key: string, check?: string): ValueUnit | undefined {
  if (check !== undefined) return (VALUE_UNITS as Record<string, Record<string, ValueUnit> | undefined>)[check]?.[key];
  return KEY_UNIT.get(key) ?? KEY_UNIT.get(key.replace(SUFFIX, '')) ?? undefined;
}

export interface PublishedCheck {
  id: string;
  clause: string;
  applies: boolean;
  reason?: string;
  utilisation: number | null;
  passes: boolean;
  at: number | null;
  values: Record<string, number | string | boolean>;
  /** the unit of each numeric value, as published ('-' for a ratio) */
  units: Record<string, ValueUnit>;
}

/** A published number: 5 significant figures (integers above that stay whole), no binary round-off. */
export function roundPublished(v: number): number {
  return round(v);
}

function round(v: number): number {
  if (!Number.isFinite(v)) return v;
  const a = Math.abs(v);
  if (a === 0) return 0;
  const digits = Math.max(0, 5 - Math.ceil(Math.log10(a)));
  const f = 10 ** Math.min(digits, 9);
  // dividing by a power of ten is exact to the last bit for these magnitudes; parse the
  // decimal text so no representation error (e.g. 31826.286400000005) survives
  return Number((Math.round(v * f) / f).toFixed(Math.min(digits, 9)));
}

/** A check result in public units; utilisation rounded to 4 decimals, values to 5 significant figures. */
export function publishCheck(c: CheckResult): PublishedCheck {
  const values: Record<string, number | string | boolean> = {};
  const units: Record<string, ValueUnit> = {};
  for (const [k, v] of Object.entries(c.values)) {
    // a value the check did not compute (NaN, e.g. φLT where 6.3.2.2(4) lets the reduction be
    // ignored) is left out, never published as null
    if (typeof v === 'number' && !Number.isFinite(v)) continue;
    if (typeof v !== 'number') values[k] = v;
    else {
      const unit = unitOf(k, c.id) ?? '-';
      values[k] = round(convertValue(unit, v));
      units[k] = unit;
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
    units,
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
