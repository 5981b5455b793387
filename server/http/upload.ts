import type { Request, Response } from 'express';
import multer, { MulterError } from 'multer';
import { AppError, BadRequestError, PayloadTooLargeError } from '../errors';

/** Multipart field that carries the file of every upload route. */
export const FILE_FIELD = 'file';

export interface UploadRule {
  maxBytes: number;
  /** What the file is, for messages: "the CSV", "the photo or PDF". */
  what: string;
}

export interface UploadedFile {
  buffer: Buffer;
  fileName: string;
}

function translate(error: unknown, rule: UploadRule): Error {
  if (error instanceof AppError) return error;
  if (error instanceof MulterError) {
    if (error.code === 'LIMIT_FILE_SIZE')
      return new PayloadTooLargeError(`The file is larger than ${rule.maxBytes / 1024 / 1024} MB.`);
    if (error.code === 'LIMIT_UNEXPECTED_FILE') {
      return new BadRequestError(
        `Send ${rule.what} in the multipart field '${FILE_FIELD}' (got '${error.field ?? ''}'), one file only.`,
      );
    }
  }
  // Anything else the multipart reader throws (no boundary, a truncated body) is the request's fault.
  const reason = error instanceof Error ? error.message : String(error);
  return new BadRequestError(`The upload could not be read (${reason}). Send ${rule.what} as multipart/form-data.`);
}

/**
 * Reads one file of a multipart request into memory. Called inside the route handler, after the
 * role check, so a caller without the right role never gets a file buffered.
 */
export function receiveFile(req: Request, res: Response, rule: UploadRule): Promise<UploadedFile> {
  const receive = multer({
    storage: multer.memoryStorage(),
    limits: { fileSize: rule.maxBytes, files: 1 },
    // Phones name photos in UTF-8; busboy's default would read those names as Latin-1.
    defParamCharset: 'utf8',
  }).single(FILE_FIELD);
  return new Promise((resolve, reject) => {
    receive(req, res, (error?: unknown) => {
      if (error) return reject(translate(error, rule));
      if (!req.file)
        return reject(new BadRequestError(`Attach ${rule.what} as multipart/form-data in the field '${FILE_FIELD}'.`));
      resolve({ buffer: req.file.buffer, fileName: req.file.originalname });
    });
  });
}
