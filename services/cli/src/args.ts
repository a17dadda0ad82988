import { parseArgs } from 'node:util';
import { InputError } from './io.js';

/** The options a command takes: switches (`--json`) and options with a value (`--out FILE`). */
export interface CommandOptions {
  switches?: readonly string[];
  valued?: readonly string[];
}

export interface ParsedCommand {
  positionals: string[];
  flags: Set<string>;
  values: Map<string, string>;
}

/**
 * The arguments after a command, by node's own parser (util.parseArgs, strict): an unknown
 * option, a switch given a value or an option without its value is an InputError carrying the
 * command's usage, so the command exits 2 and says what it takes (a misspelt `--josn` was
 * silently ignored before).
 */
export function parseCommand(argv: readonly string[], spec: CommandOptions, usage: string): ParsedCommand {
  const options: Record<string, { type: 'boolean' | 'string' }> = {};
  for (const s of spec.switches ?? []) options[s] = { type: 'boolean' };
  for (const v of spec.valued ?? []) options[v] = { type: 'string' };
  let r: ReturnType<typeof parseArgs>;
  try {
    r = parseArgs({ args: [...argv], options, strict: true, allowPositionals: true });
  } catch (e) {
    const m = (e as Error).message.replace(/\. To specify a positional argument.*$/s, '').replace(/^Unknown option '(.*?)'.*$/s, "unknown option '$1'");
    throw new InputError(`${m}\n\n${usage}`);
  }
  const flags = new Set<string>();
  const values = new Map<string, string>();
  for (const [k, v] of Object.entries(r.values)) {
    if (v === true) flags.add(k);
    else if (typeof v === 'string') values.set(k, v);
  }
  return { positionals: r.positionals, flags, values };
}
