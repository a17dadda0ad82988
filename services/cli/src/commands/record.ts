import { htmlToPdf, PdfUnavailable, renderRecord } from '@platesmith/report';
import { formatIssues, parseRecordRequest, publishRecord, TITLE_FIELDS, type RecordTitle } from '@platesmith/schema';
import { EXIT, InputError, writeOut, type Out } from '../io.js';

export const RECORD_USAGE = `usage: platesmith record FILE.json [--out girder.html] [--pdf girder.pdf] [title options]
  FILE.json              a check input (a section with a problem, or under design effects), as for check;
                         it may carry "title": { project, mark, revision, preparedBy, checkedBy, date }
  --out girder.html      write the calculation record as one self-contained HTML file
  --pdf girder.pdf       print it to PDF with headless chromium (bash scripts/install-chromium.sh)
  --project, --mark, --revision, --prepared-by, --checked-by, --date TEXT
                         the title block (over the file's "title"; blank where not given)
without --out or --pdf the HTML goes to standard output.
exit codes: 0 every check passes, 1 a check fails (the record is written all the same), 2 bad input`;

export const RECORD_OPTIONS = { valued: ['out', 'pdf', 'project', 'mark', 'revision', 'prepared-by', 'checked-by', 'date'] } as const;

const FLAG: Record<(typeof TITLE_FIELDS)[number], string> = { project: 'project', mark: 'mark', revision: 'revision', preparedBy: 'prepared-by', checkedBy: 'checked-by', date: 'date' };

/** `record`: the calculation record of one girder, as HTML and/or PDF. */
export async function runRecord(input: unknown, values: ReadonlyMap<string, string>, io: Out): Promise<number> {
  const parsed = parseRecordRequest(input);
  if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
  const title: Partial<RecordTitle> = { ...parsed.value.title };
  for (const k of TITLE_FIELDS) {
    const v = values.get(FLAG[k]);
    if (v !== undefined) title[k] = v;
  }
  const data = publishRecord(parsed.value.check, parsed.value.raw, title);
  const html = renderRecord(data);
  const out = values.get('out');
  const pdf = values.get('pdf');
  if (out) writeOut(out, html);
  if (pdf) {
    let bytes: Buffer;
    try {
      bytes = await htmlToPdf(html);
    } catch (e) {
      if (e instanceof PdfUnavailable) throw new InputError(`cannot print ${pdf}: ${e.message}`);
      throw e;
    }
    writeOut(pdf, bytes);
  }
  if (!out && !pdf) io.out(html);
  const g = data.verdict.governing;
  const written = [out, pdf].filter(Boolean).join(' and ');
  const gov = `${g.id}, ${g.clause}, utilisation ${g.utilisation ?? 'inf'}`;
  if (written) io.err(`${written}: ${data.verdict.passes ? `every check passes (governing: ${gov})` : `a check FAILS (governing: ${gov})`}.`);
  return data.verdict.passes ? EXIT.ok : EXIT.fails;
}
