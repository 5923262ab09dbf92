/**
 * The lab's signing identity for certificate PDFs, loaded once per process: the configured P12
 * (SIGNING_P12_PATH and SIGNING_P12_PASSPHRASE) or the self-signed one under DATA_DIR/signing,
 * generated on first use. server/index.ts asks for it at start-up, so a wrong passphrase or a
 * missing file stops the server there rather than at the first approval.
 */
import type { Config } from '../../config/env';
import { ensureSigningIdentity, type SigningIdentity } from '../../signing';

const cache = new Map<string, Promise<SigningIdentity>>();

export function labSigningIdentity(config: Pick<Config, 'dataDir' | 'signing'>, labName?: string): Promise<SigningIdentity> {
  const key = config.signing ? `p12:${config.signing.p12Path}` : `dir:${config.dataDir}`;
  let found = cache.get(key);
  if (!found) {
    found = ensureSigningIdentity({
      dataDir: config.dataDir,
      p12Path: config.signing?.p12Path,
      passphrase: config.signing?.passphrase,
      labName,
    });
    found.catch(() => cache.delete(key));
    cache.set(key, found);
  }
  return found;
}
