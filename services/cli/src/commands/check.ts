import { checkSection, parseCheckRequest } from '@platesmith/app';
import { formatIssues } from '@platesmith/schema';
import { EXIT, InputError, type Out } from '../io.js';
import { caution, renderChecks } from '../render.js';

/** `check`: a section under raw effects ({ effects: [...] }) or for a problem (spans and actions, or an envelope). */
export function runCheck(input: unknown, json: boolean, io: Out): number {
  const parsed = parseCheckRequest(input);
  if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
  const r = checkSection(parsed.value);
  if (json) {
    const { caution: _c, scope: _s, ...verdict } = r;
    io.out(JSON.stringify(verdict, null, 2));
  } else {
    const sw = r.selfWeight === undefined ? '' : `self-weight added: ${r.selfWeight.toFixed(3)} kN/m (web, flanges, stiffeners)\n\n`;
    io.out(`${sw}${renderChecks(r)}\n\n${caution()}`);
  }
  return r.passes ? EXIT.ok : EXIT.fails;
}
