import { checkGirder } from '@platesmith/checks';
import {
  CAUTION,
  SCOPE,
  CheckEffectsInput,
  CheckProblemInput,
  formatIssues,
  fromN,
  parseWith,
  publishVerdict,
  runCheckJob,
  toCheckEffects,
  toCheckProblem,
} from '@platesmith/schema';
import { EXIT, InputError, type Out } from '../io.js';
import { caution, renderAssumptions, renderChecks } from '../render.js';

/** `check`: a section under raw effects ({ effects: [...] }) or for a problem (spans and actions, or an envelope). */
export function runCheck(input: unknown, json: boolean, io: Out, wide = false): number {
  const raw = typeof input === 'object' && input !== null && 'effects' in input;
  let verdict;
  let selfWeight: number | null = null;
  if (raw) {
    const parsed = parseWith(CheckEffectsInput, input);
    if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
    const { section, effects, options, assumptions } = toCheckEffects(parsed.value);
    verdict = publishVerdict(checkGirder(section, effects, options), assumptions);
  } else {
    const parsed = parseWith(CheckProblemInput, input);
    if (!parsed.ok) throw new InputError(formatIssues(parsed.issues));
    const job = toCheckProblem(parsed.value);
    selfWeight = job.g;
    verdict = publishVerdict(runCheckJob(job), job.assumptions);
  }
  if (json) io.out(JSON.stringify({ ...verdict, ...(selfWeight === null ? {} : { selfWeight: Math.round(fromN(selfWeight) * 1e6) / 1e3 }), caution: CAUTION, scope: SCOPE }, null, 2));
  else {
    const sw = selfWeight === null ? '' : `self-weight added: ${(selfWeight).toFixed(3)} kN/m (web, flanges, stiffeners)\n\n`;
    io.out(`${sw}${renderChecks(verdict, wide)}\n\n${renderAssumptions(verdict.assumptions ?? [])}${caution()}`);
  }
  return verdict.passes ? EXIT.ok : EXIT.fails;
}
