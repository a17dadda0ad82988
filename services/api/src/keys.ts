import { createHash, timingSafeEqual } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { DomainError } from '@platesmith/catalogue';

/** Shortest key accepted: a key is a bearer secret, so it must not be guessable (e.g. `openssl rand -hex 24`). */
export const MIN_KEY_LENGTH = 16;

const NAMED = /^([A-Za-z0-9_.-]{1,40}):(.+)$/;

interface Key {
  /** what the log, the job's owner and the rate limit name: the key's name, or key- and a short hash of the secret */
  id: string;
  /** SHA-256 of the secret: compared in constant time, at one length whatever the key's */
  digest: Buffer;
}

const sha256 = (s: string): Buffer => createHash('sha256').update(s, 'utf8').digest();

/**
 * Parses keys: one a line or comma-separated, blank lines and `#` comments ignored. A key is
 * either a bare secret (its id is `key-` and the first 10 hex digits of its SHA-256) or
 * `NAME:SECRET` (its id is NAME, so a rotated secret under the same name keeps its jobs).
 * Throws a DomainError naming `field` for a short secret or a name given twice.
 */
export function parseKeys(text: string, field: string): Key[] {
  const keys: Key[] = [];
  const ids = new Set<string>();
  const entries = text.split(/[\n,]/).map((l) => l.trim()).filter((l) => l !== '' && !l.startsWith('#'));
  for (const [n, e] of entries.entries()) {
    const m = NAMED.exec(e);
    const secret = m ? m[2]!.trim() : e;
    if (secret.length < MIN_KEY_LENGTH) {
      throw new DomainError('API_KEYS_INVALID', `key ${n + 1} of ${field} has ${secret.length} characters; a key has at least ${MIN_KEY_LENGTH}`, 'use long random keys, e.g. the output of `openssl rand -hex 24`', field);
    }
    const digest = sha256(secret);
    const id = m ? m[1]! : `key-${digest.toString('hex').slice(0, 10)}`;
    if (ids.has(id)) throw new DomainError('API_KEYS_INVALID', `the key id ${id} is given twice in ${field}`, 'give each key its own name (NAME:SECRET) and each secret once', field);
    ids.add(id);
    keys.push({ id, digest });
  }
  return keys;
}

/**
 * The service's API keys: from PLATESMITH_API_KEYS (comma-separated) or PLATESMITH_API_KEYS_FILE
 * (one a line, re-read by `reload`, which the server calls on SIGHUP). Only SHA-256 digests are
 * kept; `identify` compares the presented key's digest with every key's in constant time.
 */
export class ApiKeys {
  #keys: Key[];
  readonly file: string | undefined;

  constructor(keys: Key[], file?: string) {
    this.#keys = keys;
    this.file = file;
  }

  /** The keys the environment turns on, or null when neither variable is set (keys off). */
  static fromEnv(env: NodeJS.ProcessEnv = process.env): ApiKeys | null {
    const file = env['PLATESMITH_API_KEYS_FILE'];
    const list = env['PLATESMITH_API_KEYS'];
    if (file !== undefined && file !== '') {
      if (list !== undefined && list !== '') throw new DomainError('API_KEYS_INVALID', 'PLATESMITH_API_KEYS and PLATESMITH_API_KEYS_FILE are both set', 'set one of them', 'PLATESMITH_API_KEYS_FILE');
      return new ApiKeys(ApiKeys.#read(file), file);
    }
    if (list !== undefined && list !== '') {
      const keys = parseKeys(list, 'PLATESMITH_API_KEYS');
      if (keys.length === 0) throw new DomainError('API_KEYS_INVALID', 'PLATESMITH_API_KEYS holds no key', 'give at least one key, or unset it to run without keys', 'PLATESMITH_API_KEYS');
      return new ApiKeys(keys);
    }
    return null;
  }

  static #read(file: string): Key[] {
    let text: string;
    try {
      text = readFileSync(file, 'utf8');
    } catch (e) {
      throw new DomainError('API_KEYS_INVALID', `PLATESMITH_API_KEYS_FILE=${file} cannot be read (${(e as Error).message})`, 'point PLATESMITH_API_KEYS_FILE at a readable file with one key a line', 'PLATESMITH_API_KEYS_FILE');
    }
    return parseKeys(text, 'PLATESMITH_API_KEYS_FILE');
  }

  /** keys held */
  get size(): number {
    return this.#keys.length;
  }

  /**
   * Re-reads the keys file (SIGHUP). On an error the keys held stay and the error is thrown for
   * the log; a file with no key leaves the service refusing every /v1 request (keys still on).
   */
  reload(): number {
    if (this.file === undefined) return this.#keys.length;
    this.#keys = ApiKeys.#read(this.file);
    return this.#keys.length;
  }

  /** The id of the key `presented`, or undefined. Every key is compared (no early exit), each in constant time. */
  identify(presented: string): string | undefined {
    const d = sha256(presented);
    let found: string | undefined;
    for (const k of this.#keys) if (timingSafeEqual(d, k.digest) && found === undefined) found = k.id;
    return found;
  }
}
