#!/usr/bin/env node
import { isDomainError } from '@platesmith/catalogue';
import { parseCommand } from './args.js';
import { EXIT, InputError, readJson, stdio, type Out } from './io.js';
import { runCheck } from './commands/check.js';
import { runEffects } from './commands/effects.js';
import { runSearch } from './commands/search.js';
import { runDemo } from './commands/demo.js';
import { runServe } from './commands/serve.js';
import { runWorker } from './commands/worker.js';
import { RECORD_OPTIONS, RECORD_USAGE, runRecord } from './commands/record.js';
import { runScheduleCommand, SCHEDULE_USAGE } from './commands/schedule.js';

export const USAGE = `platesmith — the lightest welded plate girders that pass Eurocode 3

usage:
  platesmith check FILE.json [--json]    check a section: under given effects, or for a problem (self-weight added)
  platesmith effects FILE.json [--json]  the analysis of a problem: reactions, MEd and VEd envelopes
  platesmith search FILE.json [--json] [--wide] [--quiet] [--budget-ms N]
                                         exact search of the plate space: Pareto set of depth against mass or cost;
                                         past N ms the points found so far (each passes, the set may be incomplete)
                                         with a warning on standard error
  platesmith record FILE.json [--out girder.html] [--pdf girder.pdf]
                                         the calculation record of one girder (platesmith record --help)
  platesmith schedule FILE [options]     run a girder schedule (.json or .csv): every mark searched and its adopted
                                         section re-checked; --baseline PREV.json compares with an earlier --out;
                                         --junit, --markdown, --report, --out write files; --rationalise K
                                         (platesmith schedule --help for every option; exit 1 on a regression)
  platesmith demo [--json]               search the bundled (invented) demo project
  platesmith serve                       start the HTTP API on HOST:PORT (default 127.0.0.1:8080)
  platesmith worker                      take schedule marks from the queue (PLATESMITH_QUEUE=redis://host:port)
                                         on this process's threads (the API's queue backend)
  platesmith help                        this text

FILE may be - for standard input. Units: mm, kN, kN/m, kNm, MPa, kg.
--wide shows every column of a table (the default fits 120 columns).
exit codes: 0 ok (a search stopped at its budget too, with a warning), 1 a check fails or no feasible
section, 2 bad input, 3 internal error`;

/** One input file and nothing else after the command. */
function oneFile(positionals: readonly string[], usage: string): string {
  if (positionals.length === 0) throw new InputError(`no input file given\n\n${usage}`);
  if (positionals.length > 1) throw new InputError(`one input file, got ${positionals.length}: ${positionals.join(', ')}\n\n${usage}`);
  return positionals[0]!;
}

/** `--budget-ms N`: a whole number of ms from 100 to 10^9, in decimal digits (never 0x1000 or 1e3). */
function budgetArg(v: string | undefined): number | undefined {
  if (v === undefined) return undefined;
  if (!/^[0-9]{1,9}$/.test(v) || Number(v) < 100) throw new InputError(`--budget-ms must be a whole number of ms (at least 100) in decimal digits, got '${v.slice(0, 40)}'`);
  return Number(v);
}

export async function main(argv: string[], io: Out = stdio): Promise<number> {
  const [cmd, ...rest] = argv;
  try {
    switch (cmd) {
      case 'check': {
        const a = parseCommand(rest, { switches: ['json', 'wide'] }, USAGE);
        return runCheck(readJson(oneFile(a.positionals, USAGE)), a.flags.has('json'), io, a.flags.has('wide'));
      }
      case 'effects': {
        const a = parseCommand(rest, { switches: ['json'] }, USAGE);
        return runEffects(readJson(oneFile(a.positionals, USAGE)), a.flags.has('json'), io);
      }
      case 'search': {
        const a = parseCommand(rest, { switches: ['json', 'wide', 'quiet'], valued: ['budget-ms'] }, USAGE);
        const budgetMs = budgetArg(a.values.get('budget-ms'));
        return await runSearch(readJson(oneFile(a.positionals, USAGE)), a.flags.has('json'), io, { wide: a.flags.has('wide'), quiet: a.flags.has('quiet'), ...(budgetMs !== undefined ? { budgetMs } : {}) });
      }
      case 'record': {
        if (rest.includes('--help')) {
          io.out(RECORD_USAGE);
          return EXIT.ok;
        }
        const a = parseCommand(rest, RECORD_OPTIONS, RECORD_USAGE);
        return await runRecord(readJson(oneFile(a.positionals, RECORD_USAGE)), a.values, io);
      }
      case 'schedule':
        if (rest.includes('--help')) {
          io.out(SCHEDULE_USAGE);
          return EXIT.ok;
        }
        return await runScheduleCommand(rest, io);
      case 'demo': {
        const a = parseCommand(rest, { switches: ['json'] }, USAGE);
        if (a.positionals.length) throw new InputError(`demo takes no file (it runs demo/kestrel-quay.json)\n\n${USAGE}`);
        return await runDemo(a.flags.has('json'), io);
      }
      case 'serve': {
        const a = parseCommand(rest, {}, USAGE);
        if (a.positionals.length) throw new InputError(`serve takes no arguments (HOST and PORT come from the environment)\n\n${USAGE}`);
        return await runServe(io);
      }
      case 'worker': {
        const a = parseCommand(rest, {}, USAGE);
        if (a.positionals.length) throw new InputError(`worker takes no arguments (PLATESMITH_QUEUE and the rest come from the environment)\n\n${USAGE}`);
        return await runWorker(io);
      }
      case undefined:
      case 'help':
      case '--help':
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
    return EXIT.internal;
  }
}

const isEntry = process.argv[1] !== undefined && import.meta.url === new URL(`file://${process.argv[1]}`).href;
if (isEntry) {
  main(process.argv.slice(2)).then((code) => {
    process.exitCode = code;
  });
}
