export type * from './types.js';
export { checkGirder, judgeGirder, firstFailure, firstFailureAmong, assembleVerdict, type Judged } from './girder.js';
// the check registry and everything derived from it
export {
  CHECKS,
  CHECK_ORDER,
  JUDGE_ORDER,
  BENDING_IDS,
  SHEAR_IDS,
  BEARING_DEPENDENT,
  PLATE_IDS,
  LAYOUT_IDS,
  PANEL_ONLY,
  WEB_ONLY,
  VALUE_UNITS_BY_CHECK,
  checkSpec,
  failsWebOnly,
  inJudgeOrder,
  judgeRank,
  type CheckSpec,
  type CheckInput,
  type CheckFamily,
  type ReportedUnit,
  type BendingCheckId,
  type ShearCheckId,
} from './registry.js';
export { prepare, withBearing } from './context.js';
export {
  sizeBearing,
  lightestFittingBearing,
  bearingCandidates,
  bearingOptions,
  bearingFlatArea,
  BEARING_MAX_PAIRS,
  BEARING_MIN_WIDTH,
  BEARING_WIDTH_STEP,
  BEARING_MAX_WIDTH,
  type BearingCandidates,
  type BearingFloor,
  type BearingOption,
} from './bearing-sizing.js';
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
  loadStiffenerPositions,
  restraintStiffenerPositions,
  resolveBearing,
  bearingPairCount,
  girderMass,
  girderSelfWeight,
  assertSection,
  iyOfPlates,
  plateStackMel,
  type Rect,
  type MassBreakdown,
  type FlangeSide,
} from './section.js';
export { chi, chiValue, ALPHA, type BucklingCurve } from './en1993-1-1/buckling-curves.js';
export { notApplicable, verdict } from './result.js';
export {
  PASS_ALLOWANCE,
  PASS_LIMIT,
  MOMENT_ROUND_OFF,
  negligibleMoment,
  PANEL_EDGE_MM,
  SAME_POSITION_MM,
  NO_HOLE_MM,
  EMPTY_RECT_MM,
  SAME_RATIO,
  VANISHING,
  BEARING_SIZING_MARGIN,
  CLOSED_FORM_MARGIN,
} from './tolerances.js';

// search bounds (each with a property test: a section beyond the bound fails the full check)
export { minWebAreaForShear, webShearCapacityBound } from './en1993-1-5/shear-bounds.js';
export { minFlangeForceForBending, minFlangeAreaForBending, maxCompressionFlangeAreaFIB } from './bending-bounds.js';

// EN 1993-1-5 shear family: pure functions beneath the checks
export {
  shearChecks,
  shearCheck,
  shearBucklingCheck,
  bendingShearCheck,
  stiffenerStiffnessCheck,
  stiffenerStrengthCheck,
  stiffenerTorsionCheck,
  endPostCheck,
  bearingStiffenerCheck,
} from './en1993-1-5/shear-family.js';
export {
  kTau,
  lambdaW,
  lambdaWSupportsOnly,
  chiW,
  vbwRd,
  vbRdCap,
  flangeC,
  vbfRd,
  vbRd,
  shearBucklingLimit,
  weakerFlange,
} from './en1993-1-5/shear-buckling.js';
export { shearArea, vplRd } from './en1993-1-5/shear-plastic.js';
export { interaction71, rho628 } from './en1993-1-5/interaction.js';
export { stiffenerSection, stiffenerIstMin, stiffenerAxialForce, strutResistance, flatTorsion, stiffenedAt } from './en1993-1-5/stiffeners.js';
export { restraintStiffenerCheck, restraintStiffenerAt, restraintForce } from './en1993-1-1/restraint-stiffener.js';
export { loadStiffenerCheck, loadStiffenerAt, loadStiffenerLcr, loadStiffenerWelds, heldAt } from './en1993-1-5/load-stiffener.js';
export { rigidEndPost, bearingCrushing, bearingColumnSection } from './en1993-1-5/end-post.js';

// EN 1993-1-1 bending family and the clauses beneath it
export { bendingChecks } from './en1993-1-1/bending-family.js';
export { classifyOutstand, classifyWebBending, classifyWebBendingCompression, webClass2Limit, webClass3Limit, classifyInternalCompression, classifySection } from './en1993-1-1/classification.js';
export { bendingForSign, bracket, firstAbove, envelopeAt, wplDoublySymmetric, iyDoublySymmetric, signsOf, type SignBending } from './en1993-1-1/bending.js';
export { kSigmaInternal, kSigmaOutstand, lambdaP, rhoInternal, rhoOutstand, internalEffectiveWidths, effectiveSection, effectiveMeff } from './en1993-1-5/effective-section.js';
export { kF, patchResistance, patchBendingInteraction, patchUtilisation, patchEta2s, patchBendingMelNeed, patchBendingFloor, type PatchType, type PatchInput, type PatchResult } from './en1993-1-5/patch-loading.js';
export { fibLimit, kFibFor, kFibMax } from './en1993-1-5/flange-induced.js';
export { mcrRitz, mcrConverged, mcrUniform, ritzTrial, ritzTrialMcr, MCR_FIRST_TERMS, MCR_TOLERANCE, type RitzSegment, type RitzPiece, type RitzTrial } from './en1993-1-1/mcr-ritz.js';
export { mcr, mcrOf, chiLT, chiLTGeneral, momentFactors, c1EndMoments, kcEndMoments, ltbCurveWelded, ltbUtilisation, momentEnvelopeOf, wagnerZj, loadHeightZg, zgOf, c3EndMoments, type MomentEnvelope } from './en1993-1-1/ltb.js';
export { fvwd, fwRd, shearFlow, pickThroat } from './en1993-1-8/weld.js';
export { deflection, unitLoadIntegrals, minIyForDeflection, minIyForDeflectionAt, pointIyNeed, iyNeedRange, type IyNeedRange, spanAt } from './sls/deflection.js';
