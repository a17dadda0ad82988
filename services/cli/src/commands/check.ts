import { checkSection, parseCheckRequest } from '@platesmith/app';
import { formatIssues } from '@platesmith/schema';
import { EXIT, InputError, type Out } from '../io.js';
import { caution, renderAssumptions, renderChecks } from '../render.js';

/** `check`: a section under raw effects ({ effects: [...] }) or for a problem (spans and actions, or an envelope). */
export function runCheck(input: unknown, json: boolean, io: Out, wide = false): number {
  const parsed = parseCheckRequest(input);
  if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
  // the same answer as the HTTP service's: the verdict, the self-weight added (problem form), caution and scope
  const r = checkSection(parsed.value);
  if (json) io.out(JSON.stringify(r, null, 2));
  else {
    const sw = r.selfWeight === undefined ? '' : `self-weight added: ${r.selfWeight.toFixed(3)} kN/m (web, flanges, stiffeners)\n\n`;
    io.out(`${sw}${renderChecks(r, wide)}\n\n${renderAssumptions(r.assumptions ?? [])}${caution()}`);
  }
  return r.passes ? EXIT.ok : EXIT.fails;
}
