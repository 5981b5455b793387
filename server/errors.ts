/** Base of every error the API reports on purpose; the error middleware maps it to its status. */
export class AppError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown[],
  ) {
    super(message);
    this.name = new.target.name;
  }
}

export class BadRequestError extends AppError {
  constructor(message: string, details?: unknown[]) {
    super(400, 'bad_request', message, details);
  }
}

export class UnauthorizedError extends AppError {
  constructor(message = 'Sign in first.') {
    super(401, 'unauthorized', message);
  }
}

export class ForbiddenError extends AppError {
  constructor(message = 'Your role may not do this.') {
    super(403, 'forbidden', message);
  }
}

export class NotFoundError extends AppError {
  constructor(message = 'Not found.') {
    super(404, 'not_found', message);
  }
}

export class ConflictError extends AppError {
  constructor(message: string, details?: unknown[]) {
    super(409, 'conflict', message, details);
  }
}

export class GoneError extends AppError {
  constructor(message: string) {
    super(410, 'gone', message);
  }
}

export class PayloadTooLargeError extends AppError {
  constructor(message: string) {
    super(413, 'payload_too_large', message);
  }
}

export interface ImportRowError {
  row: number;
  column: string;
  message: string;
}

export class ImportError extends AppError {
  constructor(message: string, details: ImportRowError[]) {
    super(422, 'import_rejected', message, details);
  }
}
