import type { Request, Response } from 'express';
import multer, { MulterError } from 'multer';
import { IMPORT_MAX_BYTES } from '../../shared/schemas/imports';
import { BadRequestError, PayloadTooLargeError } from '../errors';

/** Multipart field that carries the CSV file. */
export const FILE_FIELD = 'file';

const receive = multer({ storage: multer.memoryStorage(), limits: { fileSize: IMPORT_MAX_BYTES, files: 1 } }).single(
  FILE_FIELD,
);

function translate(error: unknown): Error {
  if (!(error instanceof MulterError))
    return error instanceof Error ? error : new BadRequestError('The upload could not be read.');
  if (error.code === 'LIMIT_FILE_SIZE')
    return new PayloadTooLargeError(`The file is larger than ${IMPORT_MAX_BYTES / 1024 / 1024} MB.`);
  if (error.code === 'LIMIT_UNEXPECTED_FILE') {
    return new BadRequestError(
      `Send the CSV in the multipart field '${FILE_FIELD}' (got '${error.field ?? ''}'), one file only.`,
    );
  }
  return new BadRequestError(`The upload could not be read: ${error.message}.`);
}

/**
 * Reads the CSV of a multipart request into memory. Runs inside the route handler, after the
 * role check, so a caller without the right role never gets a file buffered.
 */
export function receiveCsvFile(req: Request, res: Response): Promise<{ buffer: Buffer; fileName: string }> {
  return new Promise((resolve, reject) => {
    receive(req, res, (error?: unknown) => {
      if (error) return reject(translate(error));
      if (!req.file)
        return reject(new BadRequestError(`Attach the CSV file as multipart/form-data in the field '${FILE_FIELD}'.`));
      resolve({ buffer: req.file.buffer, fileName: req.file.originalname });
    });
  });
}
