import type { ScheduleRunResult } from '@platesmith/schedule';
import { markFromSearch, renderReport } from './report.js';
import type { ReportInput } from './types.js';

/** The HTML report of a finished schedule result (the CLI and the service both print this). */
export function scheduleReport(r: ScheduleRunResult, meta: { title?: string; subtitle?: string; generatedAt?: string } = {}): string {
  const rat = r.tender.rationalisation;
  const input: ReportInput = {
    title: meta.title ?? r.name ?? 'Girder schedule',
    ...(meta.subtitle !== undefined ? { subtitle: meta.subtitle } : {}),
    ...(meta.generatedAt !== undefined ? { generatedAt: meta.generatedAt } : {}),
    marks: r.marks.map((m) => {
      const rm = markFromSearch(m.mark, m.quantity, m.search, m.adopted);
      if (m.status === 'failed') {
        rm.failed = true;
        // a mark without a section already has its nearest miss (or that there is none) in the notes
        if (m.error?.code !== 'NO_FEASIBLE_SECTION') rm.notes = [...(rm.notes ?? []), `The mark failed: ${m.error?.message ?? 'failed'}.`];
      }
      return rm;
    }),
    ...(r.tender.tonnage ? { tonnage: r.tender.tonnage } : {}),
    coverage: { ...r.tender.coverage, leftOut: r.tender.leftOut, estimates: r.tender.estimates },
    ...(rat && rat.skipped === undefined ? { rationalisation: rat } : {}),
  };
  return renderReport(input);
}
