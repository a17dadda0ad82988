/**
 * Input of a schedule report: plain data, in the public units (mm, kg, kN, kNm). The tonnage
 * and rationalisation parts have the shape of the schedule package's tender outputs, so those
 * can be passed as they are; the report never computes engineering values itself.
 */
export interface ReportInput {
  title: string;
  /** e.g. the project or schedule name */
  subtitle?: string;
  /** a date or time to print, supplied by the caller so the file is reproducible */
  generatedAt?: string;
  marks: ReportMark[];
  tonnage?: ReportTonnage;
  /** what the tonnage leaves out: marks without a section (quantity, reason) and their flagged estimates */
  coverage?: ReportCoverage;
  /** how the tonnage reconciles with the lightest sections, kg */
  reconciliation?: ReportReconciliation;
  /** currency of the costs (null or absent: not said) */
  currency?: string | null;
  rationalisation?: ReportRationalisation;
}

export interface ReportCoverage {
  /** kg */
  tonnage: number;
  marks: number;
  girders: number;
  leftOut: readonly { mark: string; quantity: number; reason: string }[];
  estimates: readonly { mark: string; quantity: number; massPerGirder: number | null; mass: number | null; flag: string }[];
  /** kg */
  totalWithEstimates: number;
  short: readonly string[];
}

export interface ReportCheck {
  id: string;
  clause?: string;
  /** - ; null for a check that does not apply */
  utilisation: number | null;
  passes: boolean;
}

export interface ReportMark {
  mark: string;
  quantity: number;
  /** Pareto points: overall depth h (mm) and mass of one girder (kg) */
  pareto: { depth: number; mass: number; governing?: string }[];
  lightest?: { depth: number; mass: number; governing?: string } | null;
  /** governing checks of the adopted section (or of the lightest, when none is adopted) */
  utilisation?: { of: 'adopted' | 'lightest'; passes: boolean; checks: ReportCheck[] };
  /** design-effect envelopes along the girder against resistances (lines) */
  envelope?: {
    /** mm */
    x: number[];
    /** kNm, sagging positive */
    MEd: number[];
    /** kN */
    VEd: number[];
    /** kNm */
    McRd?: number;
    /** kNm */
    MbRd?: number;
    /** kN */
    VbRd?: number;
  };
  /** free lines printed under the mark (e.g. why no section was found) */
  notes?: string[];
  /** the mark failed (no section, or it could not be run): shown as a failure, with `notes` */
  failed?: boolean;
  /** the defaults the mark's answer applied (field, value, note) */
  assumptions?: readonly { field: string; value: string | number | boolean | readonly number[]; note: string }[];
  /** the design basis of the mark in words (spans, actions, options) */
  basis?: string[];
  /** the section counted for the mark, in words */
  section?: { of: 'adopted' | 'lightest'; words: string };
}

export interface ReportReconciliation {
  byMark: readonly { mark: string; quantity: number; section: 'adopted' | 'lightest'; perGirder: number; lightestPerGirder: number | null; savingPerGirder: number | null; saving: number | null }[];
  used: number;
  lightest: number;
  saving: number;
}

export interface ReportTonnage {
  /** kg */
  total: number;
  girders: number;
  byGrade: readonly { grade: string; mass: number; cost: number | null }[];
  byThickness: readonly { thickness: number; kind: 'plate' | 'flat'; mass: number }[];
  byMark: readonly { mark: string; quantity: number; length: number; perGirder: { total: number }; perMetre: number; total: number; cost: number | null }[];
  plates: readonly { kind: 'plate' | 'flat'; grade: string; thickness: number; width: number; length: number; count: number; mass: number; marks: readonly string[] }[];
  cost: number | null;
}

export interface ReportRationalisation {
  objective: 'mass' | 'cost';
  unrationalised: number | null;
  byK: readonly (
    | { K: number; feasible: true; total: number; penalty: number; penaltyRatio: number; sections: readonly string[]; assignment?: readonly { mark: string; candidate: string }[]; status?: string; gap?: number }
    | { K: number; feasible: false; reason: string }
  )[];
  /** marks left out of the model (no feasible candidate) */
  leftOut?: readonly { mark: string; quantity: number; reason: string }[];
  /** at most T thicknesses and W flange widths */
  plates?:
    | null
    | ({ maxThicknesses: number | null; maxWidths: number | null } & (
        | { feasible: true; total: number; penaltyRatio: number; gap: number; status: string; thicknesses: readonly number[]; widths: readonly number[] }
        | { feasible: false; reason: string }
      ));
  /** s */
  timeLimit?: number;
}
