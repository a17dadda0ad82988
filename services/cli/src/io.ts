import { mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { dirname } from 'node:path';

/** Exit codes: 0 ok, 1 a failed check or no feasible section, 2 bad input, 3 internal error. */
export const EXIT = { ok: 0, fails: 1, badInput: 2, internal: 3 } as const;

/** Why a file could not be read or written, in words (not an errno code). */
export function fileProblem(file: string, e: unknown, writing = false): string {
  const code = (e as NodeJS.ErrnoException).code;
  const words: Record<string, string> = {
    ENOENT: writing ? 'its folder cannot be created' : 'no such file',
    EACCES: 'permission denied',
    EPERM: 'permission denied',
    EISDIR: 'it is a folder, not a file',
    ENOTDIR: 'a part of the path is a file, not a folder',
    EROFS: 'the file system is read-only',
    ENOSPC: 'no space left on the device',
  };
  return `cannot ${writing ? 'write' : 'read'} ${file}: ${words[code ?? ''] ?? (e as Error).message ?? 'error'}`;
}

/** Writes a file, creating missing folders on its path; failures are an InputError in words. */
export function writeOut(file: string, data: string | Uint8Array): void {
  try {
    mkdirSync(dirname(file), { recursive: true });
    writeFileSync(file, data);
  } catch (e) {
    throw new InputError(fileProblem(file, e, true));
  }
}

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
    throw new InputError(fileProblem(file, e));
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
