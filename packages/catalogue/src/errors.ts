/**
 * Domain errors: impossible or out-of-scope input only. A failing check is a result,
 * never an exception. Each error carries a stable `code`, the offending `field` where
 * one is known, a message built from its data and a `hint` saying what to do next.
 */
export class DomainError extends Error {
  readonly code: string;
  readonly field: string | undefined;
  readonly hint: string;
  readonly data: Readonly<Record<string, unknown>>;

  constructor(code: string, message: string, hint: string, field?: string, data: Record<string, unknown> = {}) {
    super(message);
    this.name = 'DomainError';
    this.code = code;
    this.field = field;
    this.hint = hint;
    this.data = data;
  }

  /** Plain-object form: survives structured clone across worker threads. */
  toJSON(): DomainErrorData {
    return { code: this.code, message: this.message, hint: this.hint, field: this.field, data: { ...this.data } };
  }
}

export interface DomainErrorData {
  code: string;
  message: string;
  hint: string;
  field: string | undefined;
  data: Record<string, unknown>;
}

export function isDomainError(e: unknown): e is DomainError {
  return e instanceof DomainError;
}
