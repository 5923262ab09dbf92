/**
 * Authenticity of a certificate PDF as the public verification page decides it: the SHA-256 of
 * the exact bytes must equal the hash recorded when the certificate was issued. One changed byte
 * anywhere gives another hash, so a copy that was altered is "not authentic" even if it still
 * opens. (The embedded signature is checked by PDF readers; the recorded hash is what the lab
 * vouches for.)
 */
import { sha256Hex } from './hash';

export type VerificationResult<R> =
  | { authentic: true; sha256: string; record: R }
  | { authentic: false; sha256: string; record: null };

/** `lookupByHash` returns the issued record with that hash, or null (the database lookup is wired later). */
export async function verifyPdfAuthenticity<R>(
  pdf: Uint8Array,
  lookupByHash: (sha256: string) => Promise<R | null> | R | null,
): Promise<VerificationResult<R>> {
  const sha256 = sha256Hex(pdf);
  const record = await lookupByHash(sha256);
  return record === null || record === undefined ? { authentic: false, sha256, record: null } : { authentic: true, sha256, record };
}
