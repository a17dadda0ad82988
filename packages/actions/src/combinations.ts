import type { Combination, CombinationFactors } from './types.js';
import type { PsiFactors } from './psi.js';

export interface VariableInfo {
  name: string;
  psi: PsiFactors;
  /** the variable action it leads with: actions of one traffic group share it (default its own index) */
  unit?: number;
  /** its own γQ where it differs from the set's (road traffic in Annex A2) */
  gammaQ?: number;
}

/** The leading units (a traffic group's actions lead together): unit → its actions' indices, in order. */
function unitsOf(variables: readonly VariableInfo[]): number[][] {
  const by = new Map<number, number[]>();
  variables.forEach((v, j) => {
    const u = v.unit ?? j;
    if (!by.has(u)) by.set(u, []);
    by.get(u)!.push(j);
  });
  return [...by.values()];
}

/**
 * ULS combinations for the persistent/transient design situation, EN 1990:2002 6.4.3.2,
 * factors from Table A1.2(B):
 * - '6.10':   γG·G + γQ·Q_lead + Σ γQ·ψ0,i·Q_i, each variable action leading in turn;
 * - '6.10ab': 6.10a γG·G + Σ γQ·ψ0,i·Q_i, and 6.10b ξ·γG,sup·G + γQ·Q_lead + Σ γQ·ψ0,i·Q_i
 *             (γG,inf is not reduced by ξ); the envelope of all of them is the less favourable.
 * Annex A2 (road bridges): the actions of one traffic group are one variable action (they lead
 * together, each at its own ψ0 when accompanying), and road traffic takes its own γQ (Table A2.4(B):
 * 1.35; other variable actions 1.50).
 * Permanent actions are all at γG,sup or all at γG,inf (single source, 6.4.3.1(4)); both are
 * listed. A variable action that is favourable is taken as 0: that is done station by station
 * by the analysis (each factor here is the value used where the action is unfavourable).
 */
export function ulsCombinations(variables: readonly VariableInfo[], equation: '6.10' | '6.10ab', f: CombinationFactors): Combination[] {
  const out: Combination[] = [];
  const units = unitsOf(variables);
  const nQ = units.length;
  // a unit's actions at γQ when it leads, at γQ·ψ0 when it accompanies (each with its own γQ)
  const acc = (lead: number | null): number[] => variables.map((v, j) => (lead !== null && units[lead]!.includes(j) ? (v.gammaQ ?? f.gammaQ) : (v.gammaQ ?? f.gammaQ) * v.psi.psi0));
  const unitName = (i: number): string => (units[i]!.length === 1 ? variables[units[i]![0]!]!.name : units[i]!.map((j) => variables[j]!.name).join(' + '));
  const levels: { tag: string; sup: boolean }[] = [
    { tag: 'G sup', sup: true },
    { tag: 'G inf', sup: false },
  ];
  for (const lv of levels) {
    const gG = lv.sup ? f.gammaGsup : f.gammaGinf;
    if (equation === '6.10') {
      if (nQ === 0) out.push({ label: `6.10 ${lv.tag}`, limitState: 'ULS', equation: '6.10', gammaG: gG, factors: [], leading: null });
      for (let i = 0; i < nQ; i++) {
        out.push({ label: `6.10 ${lv.tag} + ${unitName(i)} lead`, limitState: 'ULS', equation: '6.10', gammaG: gG, factors: acc(i), leading: units[i]![0]! });
      }
    } else {
      out.push({
        label: nQ === 0 ? `6.10a ${lv.tag}` : `6.10a ${lv.tag} + ψ0·Q`,
        limitState: 'ULS',
        equation: '6.10a',
        gammaG: gG,
        factors: acc(null),
        leading: null,
      });
      const gB = lv.sup ? f.xi * f.gammaGsup : f.gammaGinf;
      const tagB = lv.sup ? 'ξ·G sup' : 'G inf';
      if (nQ === 0) out.push({ label: `6.10b ${tagB}`, limitState: 'ULS', equation: '6.10b', gammaG: gB, factors: [], leading: null });
      for (let i = 0; i < nQ; i++) {
        out.push({ label: `6.10b ${tagB} + ${unitName(i)} lead`, limitState: 'ULS', equation: '6.10b', gammaG: gB, factors: acc(i), leading: units[i]![0]! });
      }
    }
  }
  return out;
}

/**
 * SLS combinations, EN 1990:2002 6.5.3: characteristic (6.14b) G + Q_lead + Σψ0,i·Q_i;
 * frequent (6.15b) G + ψ1,1·Q_lead + Σψ2,i·Q_i; quasi-permanent (6.16b) G + Σψ2,i·Q_i.
 * `include: 'variable'` drops the permanent actions (γG = 0).
 */
export function slsCombinations(
  variables: readonly VariableInfo[],
  kind: 'characteristic' | 'frequent' | 'quasi-permanent',
  include: 'all' | 'variable',
): Combination[] {
  const gG = include === 'all' ? 1 : 0;
  const units = unitsOf(variables);
  const nQ = units.length;
  const pre = include === 'all' ? '' : ' (variable only)';
  if (kind === 'quasi-permanent' || nQ === 0) {
    const fac = variables.map((v) => (kind === 'quasi-permanent' ? v.psi.psi2 : 0));
    return [{ label: `${kind}${pre}`, limitState: 'SLS', equation: kind, gammaG: gG, factors: fac, leading: null }];
  }
  const out: Combination[] = [];
  for (let i = 0; i < nQ; i++) {
    const lead = (j: number) => units[i]!.includes(j);
    const fac = variables.map((v, j) =>
      kind === 'characteristic' ? (lead(j) ? 1 : v.psi.psi0) : lead(j) ? v.psi.psi1 : v.psi.psi2,
    );
    const name = units[i]!.map((j) => variables[j]!.name).join(' + ');
    out.push({ label: `${kind}${pre}, ${name} lead`, limitState: 'SLS', equation: kind, gammaG: gG, factors: fac, leading: units[i]![0]! });
  }
  return out;
}
