import { checkFieldsOf, type ScheduleJson, type ScheduleRunResult } from '@platesmith/schedule';
import { CheckProblemInput, parseWith, publishRecord, SectionJson, type RecordData } from '@platesmith/schema';
import { markFromSearch, renderReport } from './report.js';
import type { ReportInput, ReportMark } from './types.js';
import { sectionInWords } from './words.js';

/** The design basis of a mark in a few lines, from its record. */
function basisLines(d: RecordData): string[] {
  const b = d.basis;
  const out = [`spans ${b.spans.map((s) => `${s / 1000} m`).join(' + ')}, ${b.supportsText}`];
  if (b.actions.length) out.push(`actions: ${b.actions.map((a) => `${a.kind === 'permanent' ? 'G' : 'Q'} ${a.value} ${a.unit} ${a.load}${a.at !== undefined ? ` at ${a.at} mm` : ''}${a.category ? ` (category ${a.category})` : ''}`).join('; ')}`);
  if (b.combination) out.push(`${b.combination}; partial factors ${b.factorSet} (γM0 = ${b.gammaM0}, γM1 = ${b.gammaM1})`);
  out.push(`top flange restrained ${b.restraintTop}; load ${b.loadHeight}`);
  return out;
}

/**
 * The record data of a mark's counted section (adopted, else lightest) for its own problem, or
 * null when the mark has neither or its problem does not parse: the diagrams and the basis are
 * read from it (the report computes nothing itself).
 */
function markRecord(schedule: ScheduleJson, mark: string, section: SectionJson): RecordData | null {
  const g = schedule.girders.find((x) => x.mark === mark);
  if (!g) return null;
  const raw = { ...checkFieldsOf(schedule.defaults, g), section };
  const p = parseWith(CheckProblemInput, raw);
  if (!p.ok) return null;
  try {
    return publishRecord(p.value, raw);
  } catch {
    return null; // a domain error: the mark's own result says why
  }
}

function withRecord(rm: ReportMark, d: RecordData): ReportMark {
  const st = d.analysis.stations;
  const v = (id: string, key: string): number | undefined => {
    const c = d.verdict.checks.find((k) => k.id === id && k.applies);
    const x = c?.values[key];
    return typeof x === 'number' ? x : undefined;
  };
  const McRd = v('bending', 'McRd');
  const MbRd = v('lateral-torsional-buckling', 'MbRd');
  const VbRd = v('shear-buckling', 'VbRd') ?? v('shear', 'VplRd');
  rm.basis = basisLines(d);
  rm.envelope = {
    x: st.map((s) => s.x),
    MEd: st.map((s) => (Math.abs(s.MEdMin) > Math.abs(s.MEdMax) ? s.MEdMin : s.MEdMax)),
    VEd: st.map((s) => (Math.abs(s.VEdMin) > Math.abs(s.VEdMax) ? s.VEdMin : s.VEdMax)),
    ...(McRd !== undefined ? { McRd } : {}),
    ...(MbRd !== undefined ? { MbRd } : {}),
    ...(VbRd !== undefined ? { VbRd } : {}),
  };
  return rm;
}

/**
 * The HTML report of a finished schedule result (the CLI and the service both print this). With
 * the schedule itself (`meta.schedule`), each mark also shows its design basis and the moment and
 * shear diagrams of its counted section against its resistances.
 */
export function scheduleReport(r: ScheduleRunResult, meta: { title?: string; subtitle?: string; generatedAt?: string; schedule?: ScheduleJson } = {}): string {
  const rat = r.tender.rationalisation;
  const basis = new Map(r.tender.basis.map((b) => [b.mark, b.section]));
  const input: ReportInput = {
    title: meta.title ?? r.name ?? 'Girder schedule',
    ...(meta.subtitle !== undefined ? { subtitle: meta.subtitle } : {}),
    ...(meta.generatedAt !== undefined ? { generatedAt: meta.generatedAt } : {}),
    marks: r.marks.map((m) => {
      const rm = markFromSearch(m.mark, m.quantity, m.search, m.adopted);
      if (m.status === 'failed') rm.notes = [...(rm.notes ?? []), `The mark failed: ${m.error?.message ?? 'failed'}.`];
      const of = basis.get(m.mark);
      const g = meta.schedule?.girders.find((x) => x.mark === m.mark);
      // the adopted section as the schema reads it (its defaults applied, e.g. the grade)
      const adopted = g?.adopted !== undefined ? SectionJson.safeParse(g.adopted) : null;
      const section = of === 'adopted' ? (adopted?.success ? adopted.data : undefined) : of === 'lightest' ? m.search?.lightest?.section : undefined;
      if (of && section) {
        rm.section = { of, words: sectionInWords(section) };
        const d = meta.schedule ? markRecord(meta.schedule, m.mark, section) : null;
        if (d) withRecord(rm, d);
      }
      return rm;
    }),
    ...(r.tender.tonnage ? { tonnage: r.tender.tonnage } : {}),
    ...(r.tender.reconciliation ? { reconciliation: r.tender.reconciliation } : {}),
    currency: r.tender.currency ?? null,
    ...(rat && rat.skipped === undefined ? { rationalisation: rat } : {}),
  };
  return renderReport(input);
}
