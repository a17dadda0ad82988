import { DomainError } from '@platesmith/catalogue';

/** Combination factors of one variable action (dimensionless). */
export interface PsiFactors {
  psi0: number;
  psi1: number;
  psi2: number;
}

/**
 * EN 1990:2002 (+A1:2005) Annex A1, Table A1.1, recommended ψ values for buildings.
 * National annexes may change them: pass psi0/psi1/psi2 on the action to override.
 *
 * 'snow' = remainder of CEN member states, site altitude H ≤ 1000 m a.s.l.;
 * 'snow-high-altitude' = H > 1000 m a.s.l. (the same row as Finland, Iceland, Norway, Sweden);
 * 'temperature' = non-fire temperature (EN 1991-1-5).
 */
export const TABLE_A1_1: Readonly<Record<string, Readonly<PsiFactors>>> = Object.freeze({
  A: { psi0: 0.7, psi1: 0.5, psi2: 0.3 }, // domestic, residential
  B: { psi0: 0.7, psi1: 0.5, psi2: 0.3 }, // office
  C: { psi0: 0.7, psi1: 0.7, psi2: 0.6 }, // congregation
  D: { psi0: 0.7, psi1: 0.7, psi2: 0.6 }, // shopping
  E: { psi0: 1.0, psi1: 0.9, psi2: 0.8 }, // storage
  F: { psi0: 0.7, psi1: 0.7, psi2: 0.6 }, // traffic, vehicle weight ≤ 30 kN
  G: { psi0: 0.7, psi1: 0.5, psi2: 0.3 }, // traffic, 30 kN < vehicle weight ≤ 160 kN
  H: { psi0: 0.0, psi1: 0.0, psi2: 0.0 }, // roofs
  snow: { psi0: 0.5, psi1: 0.2, psi2: 0.0 },
  'snow-high-altitude': { psi0: 0.7, psi1: 0.5, psi2: 0.2 },
  wind: { psi0: 0.6, psi1: 0.2, psi2: 0.0 },
  temperature: { psi0: 0.6, psi1: 0.5, psi2: 0.0 },
});

/**
 * EN 1990:2002/A1:2005 Annex A2, Table A2.1, recommended ψ values for road bridges (from memory):
 * group gr1a (load model 1 with the footway combination value): tandem system TS 0.75/0.75/0,
 * uniformly distributed load UDL 0.40/0.40/0, pedestrian and cycle-track loads 0.40/0.40/0;
 * gr1b (single axle) 0/0.75/0; wind on the bridge (persistent design situations) 0.6/0.2/0;
 * thermal actions 0.6/0.6/0.5. Road traffic takes γQ = 1.35 in Table A2.4(B) (see isRoadTraffic).
 */
export const TABLE_A2_1: Readonly<Record<string, Readonly<PsiFactors>>> = Object.freeze({
  'road-TS': { psi0: 0.75, psi1: 0.75, psi2: 0.0 },
  'road-UDL': { psi0: 0.4, psi1: 0.4, psi2: 0.0 },
  'road-footway': { psi0: 0.4, psi1: 0.4, psi2: 0.0 },
  'road-single-axle': { psi0: 0.0, psi1: 0.75, psi2: 0.0 },
  'bridge-wind': { psi0: 0.6, psi1: 0.2, psi2: 0.0 },
  'bridge-temperature': { psi0: 0.6, psi1: 0.6, psi2: 0.5 },
});

/** Whether a category is road traffic of EN 1990 Table A2.1 (γQ of Table A2.4(B) for road traffic). */
export function isRoadTraffic(category: string | undefined): boolean {
  return category === 'road-TS' || category === 'road-UDL' || category === 'road-footway' || category === 'road-single-axle';
}

export const PSI_CATEGORIES: readonly string[] = Object.freeze([...Object.keys(TABLE_A1_1), ...Object.keys(TABLE_A2_1)]);

/**
 * ψ0, ψ1, ψ2 of an EN 1990 Table A1.1 category ('A'…'H', 'snow', 'snow-high-altitude', 'wind',
 * 'temperature'). Throws DomainError UNKNOWN_CATEGORY for anything else.
 */
export function psiFor(category: string, field = 'category'): PsiFactors {
  const row = Object.prototype.hasOwnProperty.call(TABLE_A1_1, category)
    ? TABLE_A1_1[category]
    : Object.prototype.hasOwnProperty.call(TABLE_A2_1, category)
      ? TABLE_A2_1[category]
      : undefined;
  if (row === undefined) {
    throw new DomainError(
      'UNKNOWN_CATEGORY',
      `unknown EN 1990 Table A1.1 / A2.1 category "${category}"`,
      `use one of ${PSI_CATEGORIES.join(', ')}, or give psi0, psi1 and psi2 yourself`,
      field,
      { category },
    );
  }
  return { psi0: row.psi0, psi1: row.psi1, psi2: row.psi2 };
}
