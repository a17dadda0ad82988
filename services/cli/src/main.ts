#!/usr/bin/env node
import { isDomainError } from '@platesmith/catalogue';
import { EXIT, InputError, readJson, stdio, type Out } from './io.js';
import { runCheck } from './commands/check.js';

const USAGE = `platesmith — lightest welded plate girders to Eurocode 3

usage:
  platesmith check FILE.json [--json]    check a section under given effects or a problem
  platesmith help                        this text

exit codes: 0 ok, 1 a check fails or no feasible section, 2 bad input`;

export function main(argv: string[], io: Out = stdio): number {
  const args = argv.filter((a) => !a.startsWith('--'));
  const flags = new Set(argv.filter((a) => a.startsWith('--')));
  const json = flags.has('--json');
  const [cmd, file] = args;
  try {
    switch (cmd) {
      case 'check':
        return runCheck(readJson(file), json, io);
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
if (isEntry) process.exitCode = main(process.argv.slice(2));
