/**
 * The lab's signing identity: a configured PKCS#12 (path + passphrase) is used as given; a wrong
 * passphrase or a missing file is refused with a message. (The generated self-signed identity is
 * covered in certificate-pdf.test.ts together with pdfsig.)
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createSelfSignedP12, ensureSigningIdentity, SigningIdentityError } from '../../../server/signing';
import { tempDir } from './poppler';

describe('ensureSigningIdentity with a configured P12', () => {
  const dir = tempDir('emberline-p12-');
  const p12Path = join(dir, 'real.p12');
  writeFileSync(p12Path, createSelfSignedP12({ labName: 'Configured Lab (invented)', passphrase: 'correct horse', keyBits: 2048, validityYears: 2 }));

  it('when path and passphrase are given, then that P12 is used and nothing is generated', async () => {
    const id = await ensureSigningIdentity({ dataDir: join(dir, 'data'), p12Path, passphrase: 'correct horse' });
    expect(id.source).toBe('configured');
    expect(id.subject).toBe('Configured Lab (invented)');
    expect(id.fingerprint).toMatch(/^[0-9a-f]{64}$/);
  });

  it('when the passphrase is wrong, then it is refused with a message', async () => {
    await expect(ensureSigningIdentity({ dataDir: join(dir, 'data'), p12Path, passphrase: 'wrong' })).rejects.toBeInstanceOf(SigningIdentityError);
  });

  it('when the file is missing, then the message names the path', async () => {
    await expect(ensureSigningIdentity({ dataDir: dir, p12Path: join(dir, 'none.p12'), passphrase: 'x' })).rejects.toThrow(/none\.p12/);
  });
});
