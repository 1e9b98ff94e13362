/**
 * Every error and warning the engine can report, with a stable code and a message a person can
 * read. The UI, the CLI and the tests share this list; codes never change once released, messages
 * may be improved.
 */

export interface Issue {
  /** Stable, kebab-case identifier, e.g. `pair-same-family`. */
  code: string;
  /** One or two sentences for a person at a sampling site. */
  message: string;
  /** The input key the issue concerns, when there is one (e.g. `ph`). */
  field?: string;
}

/** Thrown inside the engine, caught at its public edge and turned into `{ error: Issue }`. */
export class TufaError extends Error {
  readonly code: string;
  readonly field: string | undefined;
  constructor(code: string, message: string, field?: string) {
    super(message);
    this.name = 'TufaError';
    this.code = code;
    this.field = field;
  }
  toIssue(): Issue {
    return this.field === undefined
      ? { code: this.code, message: this.message }
      : { code: this.code, message: this.message, field: this.field };
  }
}

export function fail(code: string, message: string, field?: string): never {
  throw new TufaError(code, message, field);
}

/** Converts anything thrown into an Issue; unknown errors keep their text under `internal-error`. */
export function toIssue(e: unknown): Issue {
  if (e instanceof TufaError) return e.toIssue();
  const message = e instanceof Error ? e.message : String(e);
  return { code: 'internal-error', message: `Unexpected failure: ${message}` };
}

export function warning(code: string, message: string, field?: string): Issue {
  return field === undefined ? { code, message } : { code, message, field };
}
