import type { Request, Response } from 'express';
import multer, { MulterError } from 'multer';
import { ATTACHMENT_MAX_BYTES } from '../../shared/schemas/dock';
import { BadRequestError, PayloadTooLargeError } from '../errors';

/** Multipart field that carries the packing slip. */
export const ATTACHMENT_FIELD = 'file';

const receive = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: ATTACHMENT_MAX_BYTES, files: 1 },
  // Phones name photos in UTF-8; busboy's default would read those names as Latin-1.
  defParamCharset: 'utf8',
}).single(ATTACHMENT_FIELD);

function translate(error: unknown): Error {
  if (!(error instanceof MulterError))
    return error instanceof Error ? error : new BadRequestError('The upload could not be read.');
  if (error.code === 'LIMIT_FILE_SIZE')
    return new PayloadTooLargeError(`The file is larger than ${ATTACHMENT_MAX_BYTES / 1024 / 1024} MB.`);
  if (error.code === 'LIMIT_UNEXPECTED_FILE') {
    return new BadRequestError(
      `Send the file in the multipart field '${ATTACHMENT_FIELD}' (got '${error.field ?? ''}'), one file only.`,
    );
  }
  return new BadRequestError(`The upload could not be read: ${error.message}.`);
}

/**
 * Reads one packing-slip file of a multipart request into memory. Runs inside the route handler,
 * after the role check, so a caller without the right role never gets a file buffered.
 */
export function receiveAttachmentFile(req: Request, res: Response): Promise<{ buffer: Buffer; fileName: string }> {
  return new Promise((resolve, reject) => {
    receive(req, res, (error?: unknown) => {
      if (error) return reject(translate(error));
      if (!req.file)
        return reject(
          new BadRequestError(`Attach the photo or PDF as multipart/form-data in the field '${ATTACHMENT_FIELD}'.`),
        );
      resolve({ buffer: req.file.buffer, fileName: req.file.originalname });
    });
  });
}
