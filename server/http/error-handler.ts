import type { NextFunction, Request, Response } from 'express';
import { ZodError } from 'zod';
import { issueWords } from '../../shared/schemas/issue-words';
import { AppError, type ErrorKind } from '../errors';

const STATUS: Record<ErrorKind, number> = {
  invalid: 400,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  gone: 410,
  too_large: 413,
  unsupported_type: 415,
  rejected: 422,
  rate_limited: 429,
};

interface HttpLikeError {
  status?: number;
  statusCode?: number;
  type?: string;
  code?: string;
  message?: string;
}

/** The one place that turns an error into `{ error: { code, message, details? } }`. */
export function errorHandler(error: unknown, _req: Request, res: Response, _next: NextFunction) {
  if (res.headersSent) return;
  if (error instanceof AppError) {
    res.status(STATUS[error.kind]).json({
      error: { code: error.code, message: error.message, ...(error.details && { details: error.details }) },
    });
    return;
  }
  if (error instanceof ZodError) {
    res.status(400).json({
      error: {
        code: 'invalid_input',
        message: error.issues.map((issue) => `${issue.path.join('.') || 'input'}: ${issueWords(issue)}`).join('; '),
        details: error.issues.map((issue) => ({ path: issue.path, code: issue.code, message: issueWords(issue) })),
      },
    });
    return;
  }
  const httpError = error as HttpLikeError;
  if (httpError?.type === 'entity.too.large' || httpError?.code === 'LIMIT_FILE_SIZE') {
    res.status(413).json({ error: { code: 'payload_too_large', message: 'The request body or file is too large.' } });
    return;
  }
  if (httpError?.type === 'entity.parse.failed') {
    res.status(400).json({ error: { code: 'invalid_json', message: 'The request body is not valid JSON.' } });
    return;
  }
  if (typeof httpError?.code === 'string' && httpError.code.startsWith('LIMIT_')) {
    res.status(400).json({ error: { code: 'invalid_upload', message: httpError.message ?? 'Invalid upload.' } });
    return;
  }
  const status = httpError?.status ?? httpError?.statusCode;
  if (typeof status === 'number' && status >= 400 && status < 500) {
    res.status(status).json({ error: { code: 'bad_request', message: httpError.message ?? 'Bad request.' } });
    return;
  }
  console.error(error);
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server.' } });
}
