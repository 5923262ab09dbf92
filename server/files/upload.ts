import type { RequestHandler } from 'express';
import multer from 'multer';
import { fileTypeFromBuffer } from 'file-type';
import { AppError, ValidationError } from '../errors/app-error';

export class PayloadTooLargeError extends AppError {
  constructor(message: string) {
    super(413, 'FILE_TOO_LARGE', message);
  }
}

export class UnsupportedFileTypeError extends AppError {
  constructor(message: string) {
    super(415, 'UNSUPPORTED_FILE_TYPE', message);
  }
}

const mb = (bytes: number) => `${Math.round((bytes / 1_048_576) * 10) / 10} MB`;

/**
 * One file from a multipart form field, kept in memory (multer memoryStorage) up to `maxBytes`.
 * Nothing touches the disk here: the service stores the bytes only after every check passed.
 * A file over the limit answers 413, a missing file 400, both with a message naming the field.
 */
export function singleUpload(field: string, maxBytes: number): RequestHandler {
  const handler = multer({ storage: multer.memoryStorage(), limits: { fileSize: maxBytes, files: 1, fields: 10 } }).single(field);
  return (req, res, next) => {
    handler(req, res, (err: unknown) => {
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new PayloadTooLargeError(`The file is larger than the limit of ${mb(maxBytes)}. Nothing was stored.`));
        if (err.code === 'LIMIT_UNEXPECTED_FILE') return next(new ValidationError([{ path: ['body', err.field ?? field], message: `Send the file in the form field "${field}".` }], `Send one file in the form field "${field}".`));
        return next(new ValidationError([{ path: ['body', field], message: err.message }], `The upload was refused: ${err.message}`));
      }
      if (err) return next(err);
      if (!req.file) return next(new ValidationError([{ path: ['body', field], message: 'Choose a file to upload.' }], `No file was sent in the form field "${field}".`));
      next();
    });
  };
}

/** Checks the bytes (not the name or the declared type) are of one of the allowed MIME types. */
export async function requireContentType(bytes: Buffer, allowed: readonly string[], what: string, expected = allowed.join(' or ')): Promise<string> {
  const detected = await fileTypeFromBuffer(bytes);
  if (!detected || !allowed.includes(detected.mime)) {
    const found = detected ? `its content is ${detected.mime}` : 'its content is not a recognised file type';
    throw new UnsupportedFileTypeError(`The ${what} must be ${expected}, but ${found}. Nothing was stored.`);
  }
  return detected.mime;
}
