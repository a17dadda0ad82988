export { DomainError, isDomainError, type DomainErrorData } from './errors.js';
export {
  GRADES,
  type GradeName,
  type FySource,
  isGradeName,
  assertGrade,
  fy,
  fu,
  fyMax,
  betaW,
  maxThickness,
  bandEdges,
} from './grades.js';
export { PLATE_THICKNESSES, FLAT_BARS, WELD_THROATS, STEEL_DENSITY, STEEL_KG_PER_MM3, G_ACC, type FlatBar } from './stock.js';
