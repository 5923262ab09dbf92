import { createHash } from 'node:crypto';

/** SHA-256 of the exact bytes, lower-case hex (FIPS 180-4). */
export function sha256Hex(buf: Uint8Array): string {
  return createHash('sha256').update(buf).digest('hex');
}
