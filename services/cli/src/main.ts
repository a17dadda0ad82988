#!/usr/bin/env node
import { isDomainError } from '@platesmith/catalogue';
import { EXIT, InputError, readJson, stdio, type Out } from './io.js';
import { runCheck } from './commands/check.js';
import { runEffects } from './commands/effects.js';
import { runSearch } from './commands/search.js';
import { runDemo } from './commands/demo.js';
import { runServe } from './commands/serve.js';
import { runScheduleCommand, SCHEDULE_USAGE } from './commands/schedule.js';

const USAGE = `platesmith — the lightest welded plate girders that pass Eurocode 3

usage:
  platesmith check FILE.json [--json]    check a section: under given effects, or for a problem (self-weight added)
  platesmith effects FILE.json [--json]  the analysis of a problem: reactions, MEd and VEd envelopes
  platesmith search FILE.json [--json] [--budget-ms=N]
                                         exact search of the plate space: Pareto set of depth against mass or cost;
                                         past N ms the points found so far (each passes, the set may be incomplete)
                                         with a warning on standard error
  platesmith schedule FILE [options]     run a girder schedule (.json or .csv): every mark searched and its adopted
                                         section re-checked; --baseline PREV.json compares with an earlier --out;
                                         --junit, --markdown, --report, --out write files; --rationalise K
                                         (platesmith schedule --help for every option; exit 1 on a regression)
  platesmith demo [--json]               search the bundled (invented) demo project
  platesmith serve                       start the HTTP API on HOST:PORT (default 127.0.0.1:8080)
  platesmith help                        this text

FILE may be - for standard input. Units: mm, kN, kN/m, kNm, MPa, kg.
exit codes: 0 ok (a search stopped at its budget too, with a warning), 1 a check fails or no feasible section,
2 bad input`;

/** `--budget-ms=N`: a whole number of ms from 100 to 10^9, in decimal digits. */
function budgetArg(argv: readonly string[]): number | undefined {
  const a = argv.find((x) => x.startsWith('--budget-ms'));
  if (a === undefined) return undefined;
  const v = a.slice('--budget-ms'.length + 1);
  if (!a.startsWith('--budget-ms=') || !/^[0-9]{1,9}$/.test(v) || Number(v) < 100) throw new InputError(`--budget-ms must be given as --budget-ms=N, N a whole number of ms (at least 100), got '${a}'`);
  return Number(v);
}

export async function main(argv: string[], io: Out = stdio): Promise<number> {
  const args = argv.filter((a) => !a.startsWith('--'));
  const flags = new Set(argv.filter((a) => a.startsWith('--')).map((a) => a.split('=')[0]!));
  const json = flags.has('--json');
  const [cmd, file] = args;
  try {
    switch (cmd) {
      case 'check':
        return runCheck(readJson(file), json, io);
      case 'effects':
        return runEffects(readJson(file), json, io);
      case 'search':
        return await runSearch(readJson(file), json, io, budgetArg(argv));
      case 'schedule':
        if (flags.has('--help')) {
          io.out(SCHEDULE_USAGE);
          return EXIT.ok;
        }
        return await runScheduleCommand(argv.slice(argv.indexOf('schedule') + 1), io);
      case 'demo':
        return await runDemo(json, io);
      case 'serve':
        return await runServe(io);
      case undefined:
      case 'help':
        io.out(USAGE);
        return EXIT.ok;
      default:
        throw new InputError(`unknown command "${cmd}"\n\n${USAGE}`);
    }
  } catch (e) {
    if (e instanceof InputError) {
      io.err(`error: ${e.message}`);
      return EXIT.badInput;
    }
    if (isDomainError(e)) {
      io.err(`error: ${e.field ? `${e.field}: ` : ''}${e.message}\nhint: ${e.hint}`);
      return EXIT.badInput;
    }
    io.err(`internal error: ${(e as Error).message ?? String(e)} — please report this with the input file`);
    return 3;
  }
}

const isEntry = process.argv[1] !== undefined && import.meta.url === new URL(`file://${process.argv[1]}`).href;
if (isEntry) {
  main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
