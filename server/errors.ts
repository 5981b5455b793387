/*
 * Errors the services raise on purpose. They say what went wrong in domain terms (a kind, a code
 * the client can act on, a message a person can read, details naming fields or rows); only the
 * error middleware knows which HTTP status each kind becomes.
 */

export type ErrorKind =
  | 'invalid'
  | 'unauthenticated'
  | 'forbidden'
  | 'not_found'
  | 'conflict'
  | 'gone'
  | 'too_large'
  | 'unsupported_type'
  | 'rejected'
  | 'rate_limited';

/** Base of every error the API reports on purpose. */
export class AppError extends Error {
  constructor(
    readonly kind: ErrorKind,
    readonly code: string,
    message: string,
    readonly details?: unknown[],
  ) {
    super(message);
    this.name = new.target.name;
  }
}

/** Input that breaks a rule zod cannot see (a reference, a combination of fields). */
export class InvalidInputError extends AppError {
  constructor(message: string, details?: unknown[], code = 'invalid_input') {
    super('invalid', code, message, details);
  }
}

/** Well-formed input that the plant's rules refuse (a ship date already past): 422 naming the field. */
export class RefusedInputError extends AppError {
  constructor(message: string, details?: unknown[], code = 'refused') {
    super('rejected', code, message, details);
  }
}

export class BadRequestError extends AppError {
  constructor(message: string, details?: unknown[]) {
    super('invalid', 'bad_request', message, details);
  }
}

export class UnauthorizedError extends AppError {
  constructor(message = 'Sign in first.') {
    super('unauthenticated', 'unauthorized', message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = 'Your role may not do this.') {
    super('forbidden', 'forbidden', message);
  }
}

export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super('not_found', 'not_found', message);
  }
}

/** The request is well formed but clashes with the current state; `code` says how. */
export class ConflictError extends AppError {
  constructor(message: string, details?: unknown[], code = 'conflict') {
    super('conflict', code, message, details);
  }
}

export class GoneError extends AppError {
  constructor(message: string) {
    super('gone', 'gone', message);
  }
}

export class PayloadTooLargeError extends AppError {
  constructor(message: string) {
    super('too_large', 'payload_too_large', message);
  }
}

export class UnsupportedTypeError extends AppError {
  constructor(message: string) {
    super('unsupported_type', 'unsupported_file_type', message);
  }
}

export class RateLimitedError extends AppError {
  constructor(message: string, details?: unknown[]) {
    super('rate_limited', 'rate_limited', message, details);
  }
}

export interface ImportRowError {
  row: number;
  column: string;
  message: string;
}

/** A file whose rows break the rules: every problem, with its row and column; nothing was written. */
export class ImportError extends AppError {
  constructor(message: string, details: ImportRowError[]) {
    super('rejected', 'import_rejected', message, details);
  }
}
