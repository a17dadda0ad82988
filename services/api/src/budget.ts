import { z } from 'zod';

/** The time budget every synchronous /v1 POST takes: a server default and a maximum, ms. */
export interface BudgetLimits {
  defaultMs: number;
  maxMs: number;
}

/**
 * `?budgetMs=` as plain decimal digits only: a number form such as 0x1000, 1e3 or " 100" is
 * refused (400) rather than read as something the client may not have meant.
 */
export function budgetQuery(b: BudgetLimits, what: string) {
  return z.strictObject({
    budgetMs: z
      .string()
      .regex(/^[0-9]{1,9}$/, { message: 'budgetMs must be a whole number of ms in decimal digits' })
      .transform((s) => Number(s))
      .pipe(z.number().int().min(100, { message: 'budgetMs is at least 100 ms' }).max(b.maxMs, { message: `budgetMs is at most ${b.maxMs} ms (this server's maximum)` }))
      .optional()
      .meta({ description: `time budget of the ${what}, ms (default ${b.defaultMs}, at least 100, at most ${b.maxMs}; decimal digits)` }),
  });
}
