import { FLAT_BARS, WELD_THROATS } from '@platesmith/catalogue';
import type { CheckOptions, Factors } from './types.js';

/**
 * Partial-factor sets (recommended values):
 * - buildings: EN 1993-1-1 6.1(1) NOTE 2B γM0 = 1.00, γM1 = 1.00; EN 1993-1-8 Table 2.1 γM2 = 1.25.
 * - bridges: EN 1993-2 6.1 Table 6.1 γM0 = 1.00, γM1 = 1.10, γM2 = 1.25.
 * National annexes may set other values: pass explicit factors then.
 */
export const FACTOR_SETS: Readonly<Record<'buildings' | 'bridges', Factors>> = {
  buildings: { gammaM0: 1.0, gammaM1: 1.0, gammaM2: 1.25 },
  bridges: { gammaM0: 1.0, gammaM1: 1.1, gammaM2: 1.25 },
};

/** EN 1993-1-1 3.2.6: E = 210000 MPa, G = E / (2(1 + ν)) ≈ 81000 MPa. */
export const E_STEEL = 210000;
export const G_STEEL = 81000;

/** Default options for a simply supported girder of length L (mm). */
export function defaultOptions(L: number, overrides: Partial<CheckOptions> = {}): CheckOptions {
  return {
    factors: FACTOR_SETS.buildings,
    eta: 1.2,
    fySource: 'product',
    kFib: 'auto',
    supports: [0, L],
    restraint: { kind: 'at', at: [] },
    restraintBottom: { kind: 'at', at: [] },
    loadHeight: 'top-flange',
    ltbMethod: 'general',
    ltbModification: false,
    weldThroats: [...WELD_THROATS],
    E: E_STEEL,
    G: G_STEEL,
    supportBearingLength: 100,
    snipe: 20,
    bearingFlats: FLAT_BARS.map((f) => ({ b: f.b, t: f.t })),
    ...overrides,
  };
}
