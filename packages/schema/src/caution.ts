/**
 * The caution every human-facing output carries (README, CLI, report, API docs).
 * Girders carry people.
 */
export const CAUTION =
  'Platesmith is a design aid. Results use the EN 1993 recommended values unless other factors are given, ' +
  'and must be checked by a competent engineer against the governing code and its national annex before use.';

export const SCOPE =
  'Not covered: fatigue, fire, seismic actions, erection and construction stages, longitudinal web stiffeners, ' +
  'flange splices and connections other than the web-to-flange welds, torsion, axial force, ' +
  'and the end post acting as a beam against the tension field.';
