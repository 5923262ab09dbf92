import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';

/**
 * The secret better-auth signs cookies with. Given (AUTH_SECRET): used as is. Not given: read from
 * `<dataDir>/auth-secret`, or generated there on first start (mode 0600), so sessions survive
 * restarts without anyone having to invent a secret.
 */
export function resolveAuthSecret(opts: { authSecret?: string; dataDir: string }): string {
  if (opts.authSecret) return opts.authSecret;
  const file = path.join(opts.dataDir, 'auth-secret');
  try {
    const existing = fs.readFileSync(file, 'utf8').trim();
    if (existing.length >= 32) return existing;
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'ENOENT') throw err;
  }
  fs.mkdirSync(opts.dataDir, { recursive: true });
  const secret = crypto.randomBytes(32).toString('base64url');
  // 'wx' fails if another process created the file meanwhile: then use theirs.
  try {
    fs.writeFileSync(file, secret + '\n', { mode: 0o600, flag: 'wx' });
    return secret;
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'EEXIST') return fs.readFileSync(file, 'utf8').trim();
    throw err;
  }
}
