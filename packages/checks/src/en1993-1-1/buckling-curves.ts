/**
 * EN 1993-1-1:2005 6.3.1.2, eq. 6.49 and Table 6.1 (imperfection factors), also used for
 * lateral-torsional buckling by 6.3.2.2 (Table 6.3, same α per curve letter).
 */
export type BucklingCurve = 'a0' | 'a' | 'b' | 'c' | 'd';

export const ALPHA: Readonly<Record<BucklingCurve, number>> = { a0: 0.13, a: 0.21, b: 0.34, c: 0.49, d: 0.76 };

/** χ = 1 / (Φ + √(Φ² − λ̄²)) ≤ 1 with Φ = 0.5[1 + α(λ̄ − 0.2) + λ̄²]; λ̄ ≤ 0.2 gives 1. */
/** chi(λ̄, curve).chi alone, with no object made (the same operations). */
export function chiValue(lambdaBar: number, curve: BucklingCurve): number {
  const alpha = ALPHA[curve];
  const phi = 0.5 * (1 + alpha * (lambdaBar - 0.2) + lambdaBar * lambdaBar);
  if (lambdaBar <= 0.2) return 1;
  return Math.min(1, 1 / (phi + Math.sqrt(phi * phi - lambdaBar * lambdaBar)));
}

export function chi(lambdaBar: number, curve: BucklingCurve): { chi: number; phi: number; alpha: number } {
  const alpha = ALPHA[curve];
  const phi = 0.5 * (1 + alpha * (lambdaBar - 0.2) + lambdaBar * lambdaBar);
  if (lambdaBar <= 0.2) return { chi: 1, phi, alpha };
  const c = 1 / (phi + Math.sqrt(phi * phi - lambdaBar * lambdaBar));
  return { chi: Math.min(1, c), phi, alpha };
}
