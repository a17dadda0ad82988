/**
 * Tender outputs of a schedule: tonnage and the plate list, rationalisation to K sections
 * (MILP), the nightly regression comparison with JUnit and Markdown writers, and CSV input.
 */
export { tonnage, tenderGirder, pieceMass, type TenderGirder, type Tonnage, type MarkTonnage, type PlateLine, type PlatePart, type Rates } from './tonnage.js';
export {
  rationalise,
  assignmentValues,
  candidatesFrom,
  feasibilityMatrix,
  sectionMassPerMetre,
  sectionKey,
  platesOf,
  type RationaliseInput,
  type RationaliseProgress,
  type RationalisedChoice,
  type PlateRationalisation,
  type SolveStatus,
  type RationaliseMark,
  type RationaliseCandidate,
  type Rationalisation,
  type RationalisedK,
  type Assignment,
} from './rationalise.js';
export { compare, markRecord, toJUnit, toMarkdown, xmlEscape, type MarkRecord, type CompareResult, type CompareStatus, type CompareOptions } from './compare.js';
export { parseScheduleCsv, CSV_COLUMNS, type CsvIssue, type CsvParsed, type CsvSchedule, type CsvGirder, type CsvAction } from './csv.js';
