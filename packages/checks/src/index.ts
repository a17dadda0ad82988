export type * from './types.js';
export { checkGirder, CHECK_ORDER } from './girder.js';
export { prepare } from './context.js';
export { defaultOptions, FACTOR_SETS, E_STEEL, G_STEEL } from './options.js';
export {
  epsilon,
  material,
  grossProps,
  rects,
  elastic,
  plastic,
  firstYieldMoment,
  flangeOutstand,
  flangeAndPlasticMoments,
  compressionSide,
  panelsOf,
  resolveBearing,
  girderMass,
  assertSection,
  type Rect,
  type MassBreakdown,
  type FlangeSide,
} from './section.js';
export { chi, ALPHA, type BucklingCurve } from './en1993-1-1/buckling-curves.js';
export { notApplicable, verdict } from './result.js';
