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
  ['kNm', ['MEd', 'MEdMax', 'MEdVbf', 'MRdElastic', 'McRd', 'MplRd', 'MelRd', 'MeffRd', 'MfRd', 'Mcr', 'McrUniform', 'McrThreeFactor', 'MbRd', 'MyRd', 'MRd', 'MplFlangesRd']],
  ['kN', ['VEd', 'VplRd', 'VbwRd', 'VbfRd', 'VbRd', 'NEd', 'NbRd', 'FRd', 'F', 'FEd', 'R', 'FbRd', 'Fcr', 'Ncr', 'NcrStiff', 'VEdPanel']],
  ['kN/m', ['vEd', 'qEd', 'FwRd', 'FwEd', 'fwEd']],
  ['MPa', ['fy', 'fyw', 'fyf', 'fyTop', 'fyBot', 'fvwd', 'fu', 'fyStiff', 'sigmaEd', 'tauEd']],
  ['mm', ['x0', 'x1', 'a', 'ly', 'le', 'delta', 'limit', 'throat', 'zEff', 'e', 'eMin', 'ss', 'c', 'zg', 'zj', 'Lcr', 'L', 'hw', 'tw', 'span', 'beff', 'bEff', 'b', 'Lseg', 'Leff', 'eN', 'aRequired', 'weldThroatInC']],
  ['mm2', ['Av', 'Aeff', 'Afc', 'Ast', 'AstMin', 'Abearing', 'A', 'Aw', 'Anet']],
  ['mm3', ['Weff', 'Wel', 'Wpl', 'Wy']],
  ['mm4', ['Ist', 'IstMin', 'Ieff', 'Iy', 'Iz', 'It', 'Ip']],
  // ratios, factors, slendernesses and classes
  [
    '-',
    [
      'sectionClass', 'flangeClass', 'webClass', 'cOverTflange', 'cOverTweb', 'alpha', 'psi', 'psiWeb', 'rhoFlange', 'rhoWeb',
      'kTau', 'lambdaW', 'chiW', 'hwOverTw', 'eta1', 'eta2', 'eta3', 'interaction', 'ratio', 'k', 'kF', 'm1', 'm2', 'lambdaF', 'chiF',
      'chi', 'lambdaBar', 'lambdaWRemoved', 'ItOverIp', 'C1', 'C2', 'C3', 'lambdaLT', 'lambdaLT0', 'phiLT', 'f', 'chiLT',
      'kw', 'kc', 'McrTerms', 'McrChange', 'C1Table', 'C2Table', 'C3Table',
    ],
  ],
];
for (const [unit, keys] of groups) for (const k of keys) VALUE_UNITS[k] = unit;

/** Keys whose unit differs by check (`limit` is a length for deflection, a ratio elsewhere). */
const BY_CHECK: Record<string, ValueUnit> = {
  'flange-induced-buckling.limit': '-',
  'stiffener-torsion.limit': '-',
  'patch-bending.limit': '-',
  'shear-buckling.limit': '-',
  'bending-shear.limit': '-',
};

/** Suffixes a check adds to a key for one sign or flange (`McRd_sagging`): the unit is the base key's. */
const SUFFIX = /_(sagging|hogging|top|bot|bottom)$/;

/** The published unit of a `values` key (its base key's for a suffixed one), or undefined when nobody classified it. */
export function unitOf(key: string, check?: string): ValueUnit | undefined {
  return (check === undefined ? undefined : BY_CHECK[`${check}.${key}`]) ?? VALUE_UNITS[key] ?? VALUE_UNITS[key.replace(SUFFIX, '')];
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
