import { formatIssues, parseWith, ProblemJson, publishEffects } from '@platesmith/schema';
import { EXIT, InputError, type Out } from '../io.js';
import { fmt, table } from '../table.js';
import { caution } from '../render.js';

/** `effects`: the analysis of a problem (design values of the governing ULS combinations), without self-weight. */
export function runEffects(input: unknown, json: boolean, io: Out): number {
  const parsed = parseWith(ProblemJson, input);
  if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
  // the same publication as the HTTP answer: units, rounding, caution and scope
  const out = publishEffects(parsed.value);
  const s = out;
  if (json) io.out(JSON.stringify(out, null, 2));
  else {
    io.out(table(['support x (mm)', 'R (kN)'], out.reactions.map((r) => [r.x, fmt(r.R, 4)]), ['r', 'r']));
    io.out('');
    io.out(
      table(
        ['envelope', 'value', 'governing combination'],
        [
          ['MEd,max (kNm)', fmt(out.envelope.MEdMax, 4), s.governing.MEdMax],
          ['MEd,min (kNm)', fmt(out.envelope.MEdMin, 4), s.governing.MEdMin],
          ['VEd,max (kN)', fmt(out.envelope.VEdMax, 4), s.governing.VEdMax],
        ],
        ['l', 'r', 'l'],
      ),
    );
    io.out(`\n${out.stations.length} stations (use --json for all). ${out.note}.\n\n${caution()}`);
  }
  return EXIT.ok;
}
