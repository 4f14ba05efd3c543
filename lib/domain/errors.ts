/** Typed domain errors; lib/platform/http.ts maps each to one HTTP status in one place. */
export type FieldError = { path: string; message: string };

export class DomainError extends Error {
  constructor(message: string) {
    super(message);
    this.name = new.target.name;
  }
}
export class UnauthorizedError extends DomainError {
  constructor(message = 'Sign in to continue.') {
    super(message);
  }
}
export class ForbiddenError extends DomainError {
  constructor(message = 'Your role does not allow this.') {
    super(message);
  }
}
export class NotFoundError extends DomainError {
  constructor(message = 'Not found.') {
    super(message);
  }
}
export class ConflictError extends DomainError {}
/**
 * The request is valid but needs the person to confirm it first (say, e-mailing a report to an address the
 * company never used): a 409 naming the field, and the same request with `confirm: true` goes ahead.
 */
export class ConfirmationRequiredError extends ConflictError {
  constructor(
    public readonly path: string,
    message: string,
    /** A stable word for what needs confirming, so a client can tell two confirmations apart. */
    public readonly reason?: string,
    /** Figures the client shows with the question (e.g. how many findings fail). */
    public readonly details?: Record<string, string | number | boolean | null>,
  ) {
    super(message);
  }
}
export class ValidationError extends DomainError {
  constructor(
    public readonly errors: FieldError[],
    message = 'The request has invalid fields.',
  ) {
    super(message);
  }
}
export class PayloadTooLargeError extends DomainError {}
export class TooManyRequestsError extends DomainError {
  constructor(
    message: string,
    public readonly retryAfterSeconds: number,
  ) {
    super(message);
  }
}
export class ServiceUnavailableError extends DomainError {}
