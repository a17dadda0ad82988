/**
 * The objective's floor for a candidate of at least a given mass: exact for mass, a lower bound on
 * the Farkas–Jármai cost (objective.ts) otherwise. Every node's bound goes through floorOf.
 */
import type { FlangeOption, WebConfig } from '../space.js';
import type { SliceState } from './state.js';

/**
 * A lower bound on the objective of any candidate of at least `kg0` kg whose painted surface is at
 * least `As` (mm²). For cost: every rate at its least, κ ≥ 3 parts, the flange welds at the least
 * throat, no stiffener welds (each term of costOf is non-decreasing in what is dropped).
 */
export function floorOf(s: SliceState, kg0: number, As: number): number {
  // summed in another order than the exact value: lowered by a hair so that it is never above it
  const kg = kg0 * (1 - 1e-12);
  if (s.isMass) return kg;
  const cm = s.cm;
  return s.rateMin * kg + cm.kfOverKm * cm.km * (cm.thetaD * Math.sqrt(3 * kg) + s.weldFloorMin + s.paint * As);
}

/** The painted surface of a web plate and two flanges over the girder's length, mm². */
export function surfaceOf(s: SliceState, w: WebConfig, T: FlangeOption, B: FlangeOption): number {
  return s.L * (T.b + (T.b - w.tw) + 2 * T.t + B.b + (B.b - w.tw) + 2 * B.t + 2 * w.hw);
}
