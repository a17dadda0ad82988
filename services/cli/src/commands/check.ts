import { checkGirder } from '@platesmith/checks';
import { CheckEffectsInput, formatIssues, parseWith, publishVerdict, toCheckEffects } from '@platesmith/schema';
import { EXIT, InputError, type Out } from '../io.js';
import { caution, renderChecks } from '../render.js';

export function runCheck(input: unknown, json: boolean, io: Out): number {
  const parsed = parseWith(CheckEffectsInput, input);
  if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
  const { section, effects, options } = toCheckEffects(parsed.value);
  const v = publishVerdict(checkGirder(section, effects, options));
  if (json) io.out(JSON.stringify(v, null, 2));
  else io.out(`${renderChecks(v)}\n\n${caution()}`);
  return v.passes ? EXIT.ok : EXIT.fails;
}
