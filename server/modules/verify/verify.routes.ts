import express, { Router } from 'express';
import { rateLimit } from 'express-rate-limit';
import { z } from 'zod';
import { AppError, ValidationError } from '../../errors/app-error';
import { validate } from '../../middleware/validate';
import { VERIFY_MAX_BYTES } from '../../../shared/schemas/certificates-api.schema';
import type { VerifyService } from './verify.service';

const numberParams = z.object({
  number: z
    .string()
    .trim()
    .min(3, { message: 'enter the certificate number as printed on each page' })
    .max(60, { message: 'a certificate number has at most 60 characters' })
    .regex(/^[A-Za-z0-9 ()._/-]+$/, { message: 'a certificate number has letters, digits and - / . only' }),
});

const rawPdf = express.raw({ type: () => true, limit: VERIFY_MAX_BYTES });

export type VerifyRoutesOptions = {
  /** Requests per client address per window (default 30 per minute). */
  limit?: number;
  windowMs?: number;
};

/**
 * /api/verify (public): POST /file with the PDF bytes as the body (Content-Type application/pdf,
 * at most VERIFY_MAX_BYTES), GET /number/:number. Rate-limited per client address.
 */
export function verifyRoutes(verify: VerifyService, opts: VerifyRoutesOptions = {}): Router {
  const r = Router();
  r.use(
    rateLimit({
      windowMs: opts.windowMs ?? 60_000,
      limit: opts.limit ?? 30,
      standardHeaders: 'draft-7',
      legacyHeaders: false,
      handler: (_req, res) => {
        res.status(429).json({ error: { code: 'TOO_MANY_REQUESTS', message: 'Too many checks from this address: wait a minute and try again.' } });
      },
    }),
  );
  r.post(
    '/file',
    (req, res, next) =>
      rawPdf(req, res, (err?: unknown) => {
        if ((err as { type?: string } | undefined)?.type === 'entity.too.large') {
          return next(new AppError(413, 'FILE_TOO_LARGE', `The file is larger than ${VERIFY_MAX_BYTES / 1024 / 1024} MB: choose the certificate PDF as issued.`));
        }
        next(err);
      }),
    async (req, res, next) => {
      const body = req.body as unknown;
      if (!Buffer.isBuffer(body) || body.length === 0) {
        return next(new ValidationError([{ path: ['body'], message: 'send the PDF file itself as the request body' }], 'No file was received: choose or drop the certificate PDF.'));
      }
      if (body.subarray(0, 5).toString('latin1') !== '%PDF-') {
        return next(new ValidationError([{ path: ['body'], message: 'the file does not start with %PDF-' }], 'This file is not a PDF: choose the certificate PDF as you received it.'));
      }
      res.json(await verify.verifyFile(body));
    },
  );
  r.get('/number/:number', validate({ params: numberParams }), async (req, res) => {
    res.json(await verify.verifyNumber(String(req.params.number)));
  });
  return r;
}
