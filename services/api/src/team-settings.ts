import { DomainError } from '@platesmith/catalogue';
import type { ApiOptions } from './app.js';
import { JOB_DEFAULTS } from './jobs/manager.js';
import { ApiKeys } from './keys.js';
import { DEFAULT_RATE_LIMIT } from './plugins/access.js';

const UNITS: Record<string, number> = { ms: 1, s: 1000, m: 60_000, h: 3_600_000, d: 86_400_000 };

/**
 * A duration setting: a number with a unit (`90s`, `30m`, `24h`, `7d`, `500ms`), or `0` / `off`
 * (none). A four-unit pattern is shorter than a dependency for it.
 */
export function parseDuration(value: string, name: string): number {
  const v = value.trim().toLowerCase();
  if (v === '0' || v === 'off') return 0;
  const m = /^(\d+(?:\.\d+)?)\s*(ms|s|m|h|d)$/.exec(v);
  if (!m) throw new DomainError('SETTING_INVALID', `${name}=${value} is not a duration`, 'write a number and a unit: 500ms, 90s, 30m, 24h or 7d (0 or off for none)', name);
  const ms = Number(m[1]) * UNITS[m[2]!]!;
  if (!(ms <= 3650 * 86_400_000)) throw new DomainError('SETTING_INVALID', `${name}=${value} is over ten years`, 'give a shorter duration, or 0 / off for none', name);
  return ms;
}

function parseCount(value: string, name: string, min: number, max: number): number {
  const n = Number(value.trim());
  if (!/^\d+$/.test(value.trim()) || n < min || n > max) throw new DomainError('SETTING_INVALID', `${name}=${value} is not a whole number from ${min} to ${max}`, `give a whole number from ${min} to ${max}`, name);
  return n;
}

/**
 * The team settings of the service from the environment (README: "Running it for a team"):
 * keys, rate limit, job quota, mark and job time budgets, retention. An unset or empty variable
 * takes its default; a malformed one is a DomainError naming it (the server does not start).
 */
export function settingsFromEnv(env: NodeJS.ProcessEnv = process.env): Pick<ApiOptions, 'keys' | 'rateLimit' | 'jobs'> {
  const get = (name: string): string | undefined => (env[name] !== undefined && env[name]!.trim() !== '' ? env[name] : undefined);
  const rate = get('PLATESMITH_RATE_LIMIT');
  const quota = get('PLATESMITH_JOB_QUOTA');
  const mark = get('PLATESMITH_MARK_BUDGET');
  const job = get('PLATESMITH_JOB_BUDGET');
  const retention = get('PLATESMITH_JOB_RETENTION');
  return {
    keys: ApiKeys.fromEnv(env),
    rateLimit: rate !== undefined ? (rate.trim().toLowerCase() === 'off' ? 0 : parseCount(rate, 'PLATESMITH_RATE_LIMIT', 0, 1_000_000)) : DEFAULT_RATE_LIMIT,
    jobs: {
      quota: quota !== undefined ? parseCount(quota, 'PLATESMITH_JOB_QUOTA', 1, 10_000) : JOB_DEFAULTS.quota,
      markBudgetMs: mark !== undefined ? positive(parseDuration(mark, 'PLATESMITH_MARK_BUDGET'), 'PLATESMITH_MARK_BUDGET') : JOB_DEFAULTS.markBudgetMs,
      jobBudgetMs: job !== undefined ? positive(parseDuration(job, 'PLATESMITH_JOB_BUDGET'), 'PLATESMITH_JOB_BUDGET') : JOB_DEFAULTS.jobBudgetMs,
      retentionMs: retention !== undefined ? parseDuration(retention, 'PLATESMITH_JOB_RETENTION') : JOB_DEFAULTS.retentionMs,
    },
  };
}

function positive(ms: number, name: string): number {
  if (ms < 1000) throw new DomainError('SETTING_INVALID', `${name} must be at least 1 s`, 'a time budget bounds the work; give at least 1s', name);
  return ms;
}

/** Whether `host` is a loopback address (a service there is reachable from this machine only). */
export function isLoopback(host: string): boolean {
  return host === 'localhost' || host === '::1' || /^127\.\d+\.\d+\.\d+$/.test(host) || host === '::ffff:127.0.0.1';
}
