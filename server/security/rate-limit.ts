import type { RequestHandler } from 'express';
import { rateLimit } from 'express-rate-limit';

/**
 * Limits failed sign-ins per client address (OWASP ASVS 4.0 V2.2.1: anti-automation against
 * credential stuffing and brute force). Only failed attempts count (`skipSuccessfulRequests`:
 * an answer below 400 is not counted), so people who sign in correctly are never held back; once
 * `limit` failures fall in one window the address gets 429 in the API envelope until the window
 * ends. Mounted in createApp in front of better-auth's /api/auth/sign-in/email; better-auth's
 * own limiter (production only) stays on behind it. Configured by SIGN_IN_RATE_LIMIT and
 * SIGN_IN_RATE_WINDOW_MINUTES. Behind a reverse proxy, set Express's `trust proxy` so the
 * client address is the real one (express-rate-limit documentation, "Troubleshooting proxy issues").
 */
export function signInRateLimit(opts: { limit: number; windowMs: number }): RequestHandler {
  return rateLimit({
    windowMs: opts.windowMs,
    limit: opts.limit,
    skipSuccessfulRequests: true,
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    handler: (_req, res) => {
      res.status(429).json({
        error: { code: 'TOO_MANY_REQUESTS', message: 'Too many failed sign-ins from this address: wait a few minutes, then try again.' },
      });
    },
  });
}
