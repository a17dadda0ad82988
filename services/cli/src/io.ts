import { readFileSync } from 'node:fs';

/** Exit codes: 0 ok, 1 a failed check or no feasible section, 2 bad input. */
export const EXIT = { ok: 0, fails: 1, badInput: 2 } as const;

export class InputError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'InputError';
  }
}

/** Reads and parses a JSON file; a missing file or malformed JSON is an InputError that says where. */
export function readJson(file: string | undefined): unknown {
  if (!file) throw new InputError('no input file given (usage: platesmith <command> FILE.json [--json])');
  let text: string;
  try {
    text = file === '-' ? readFileSync(0, 'utf8') : readFileSync(file, 'utf8');
  } catch (e) {
    throw new InputError(`cannot read ${file}: ${(e as NodeJS.ErrnoException).code ?? 'error'}`);
  }
  try {
    return JSON.parse(text);
  } catch (e) {
    throw new InputError(`${file} is not valid JSON: ${(e as Error).message}`);
  }
}

export interface Out {
  out: (s: string) => void;
  err: (s: string) => void;
}

export const stdio: Out = {
  out: (s) => process.stdout.write(s + '\n'),
  err: (s) => process.stderr.write(s + '\n'),
};
