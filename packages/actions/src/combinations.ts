import type { Combination, CombinationFactors } from './types.js';
import type { PsiFactors } from './psi.js';

export interface VariableInfo {
  name: string;
  psi: PsiFactors;
}

/**
 * ULS combinations for the persistent/transient design situation, EN 1990:2002 6.4.3.2,
 * factors from Table A1.2(B):
 * - '6.10':   γG·G + γQ·Q_lead + Σ γQ·ψ0,i·Q_i, each variable action leading in turn;
 * - '6.10ab': 6.10a γG·G + Σ γQ·ψ0,i·Q_i, and 6.10b ξ·γG,sup·G + γQ·Q_lead + Σ γQ·ψ0,i·Q_i
 *             (γG,inf is not reduced by ξ); the envelope of all of them is the less favourable.
 * Permanent actions are all at γG,sup or all at γG,inf (single source, 6.4.3.1(4)); both are
 * listed. A variable action that is favourable is taken as 0: that is done station by station
 * by the analysis (each factor here is the value used where the action is unfavourable).
 */
export function ulsCombinations(variables: readonly VariableInfo[], equation: '6.10' | '6.10ab', f: CombinationFactors): Combination[] {
  const out: Combination[] = [];
  const nQ = variables.length;
  const acc = (lead: number | null): number[] => variables.map((v, j) => (j === lead ? f.gammaQ : f.gammaQ * v.psi.psi0));
  const levels: { tag: string; sup: boolean }[] = [
    { tag: 'G sup', sup: true },
    { tag: 'G inf', sup: false },
  ];
  for (const lv of levels) {
    const gG = lv.sup ? f.gammaGsup : f.gammaGinf;
    if (equation === '6.10') {
      if (nQ === 0) out.push({ label: `6.10 ${lv.tag}`, limitState: 'ULS', equation: '6.10', gammaG: gG, factors: [], leading: null });
      for (let i = 0; i < nQ; i++) {
        out.push({ label: `6.10 ${lv.tag} + ${variables[i]!.name} lead`, limitState: 'ULS', equation: '6.10', gammaG: gG, factors: acc(i), leading: i });
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
        out.push({ label: `6.10b ${tagB} + ${variables[i]!.name} lead`, limitState: 'ULS', equation: '6.10b', gammaG: gB, factors: acc(i), leading: i });
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
  const nQ = variables.length;
  const pre = include === 'all' ? '' : ' (variable only)';
  if (kind === 'quasi-permanent' || nQ === 0) {
    const fac = variables.map((v) => (kind === 'quasi-permanent' ? v.psi.psi2 : 0));
    return [{ label: `${kind}${pre}`, limitState: 'SLS', equation: kind, gammaG: gG, factors: fac, leading: null }];
  }
  const out: Combination[] = [];
  for (let i = 0; i < nQ; i++) {
    const fac = variables.map((v, j) =>
      kind === 'characteristic' ? (j === i ? 1 : v.psi.psi0) : j === i ? v.psi.psi1 : v.psi.psi2,
    );
    out.push({ label: `${kind}${pre}, ${variables[i]!.name} lead`, limitState: 'SLS', equation: kind, gammaG: gG, factors: fac, leading: i });
  }
  return out;
}
