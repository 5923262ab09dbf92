/**
 * The laboratory's signing identity: a PKCS#12 file holding its private key and certificate.
 *
 * Either a real one (issued by a CA the lab trusts) given by path and passphrase, or, at first
 * start, a self-signed one generated here and kept under DATA_DIR/signing/ with its generated
 * passphrase beside it, both readable by the server's user only (mode 0600). A self-signed
 * certificate proves integrity (the bytes are unchanged since signing) but not identity to a
 * third party: pdfsig reports "Certificate issuer is unknown", which is expected.
 */
import { generateKeyPairSync, randomBytes } from 'node:crypto';
import { chmod, mkdir, readFile, writeFile } from 'node:fs/promises';
import { join } from 'node:path';
import forge from 'node-forge';

export interface SigningIdentity {
  /** The PKCS#12 (DER) bytes. */
  p12: Buffer;
  passphrase: string;
  /** Subject common name of the signing certificate. */
  subject: string;
  /** SHA-256 fingerprint of the certificate (DER), lower-case hex. */
  fingerprint: string;
  notAfter: Date;
  /** Where it came from: generated now, found under DATA_DIR, or loaded from a given path. */
  source: 'generated' | 'existing' | 'configured';
}

export interface EnsureSigningIdentityOptions {
  dataDir: string;
  /** A real P12 to use instead of the self-signed one. */
  p12Path?: string;
  passphrase?: string;
  /** Subject of a generated certificate (the laboratory name). */
  labName?: string;
  /** RSA modulus length of a generated key: 2048 or 3072 (default). */
  keyBits?: 2048 | 3072;
  /** Validity of a generated certificate in years (default 10). */
  validityYears?: number;
  /** Clock for the certificate dates (tests). */
  now?: () => Date;
}

export class SigningIdentityError extends Error {
  constructor(message: string, options?: { cause?: unknown }) {
    super(message, options);
    this.name = 'SigningIdentityError';
  }
}

const P12_FILE = 'lab-signing.p12';
const PASS_FILE = 'lab-signing.passphrase';

/** Decodes a P12 and returns its certificate; throws SigningIdentityError on a wrong passphrase or a P12 without a key. */
function inspectP12(p12: Buffer, passphrase: string): { cert: forge.pki.Certificate } {
  let parsed: forge.pkcs12.Pkcs12Pfx;
  try {
    parsed = forge.pkcs12.pkcs12FromAsn1(forge.asn1.fromDer(forge.util.createBuffer(p12.toString('binary'))), passphrase);
  } catch (cause) {
    throw new SigningIdentityError('The signing P12 could not be opened: wrong passphrase or not a PKCS#12 file.', { cause });
  }
  const certBags = parsed.getBags({ bagType: forge.pki.oids.certBag })[forge.pki.oids.certBag] ?? [];
  const keyBags = [
    ...(parsed.getBags({ bagType: forge.pki.oids.pkcs8ShroudedKeyBag })[forge.pki.oids.pkcs8ShroudedKeyBag] ?? []),
    ...(parsed.getBags({ bagType: forge.pki.oids.keyBag })[forge.pki.oids.keyBag] ?? []),
  ];
  const cert = certBags.find((b) => b.cert)?.cert;
  if (!cert || keyBags.length === 0) throw new SigningIdentityError('The signing P12 must hold a private key and its certificate.');
  return { cert };
}

function describe(p12: Buffer, passphrase: string, source: SigningIdentity['source']): SigningIdentity {
  const { cert } = inspectP12(p12, passphrase);
  const der = forge.asn1.toDer(forge.pki.certificateToAsn1(cert)).getBytes();
  const fingerprint = forge.md.sha256.create().update(der).digest().toHex();
  const cn = cert.subject.getField('CN');
  return { p12, passphrase, subject: cn ? String(cn.value) : '', fingerprint, notAfter: cert.validity.notAfter, source };
}

/** Builds a self-signed certificate and P12 for `labName` (RSA, SHA-256). */
export function createSelfSignedP12(opts: { labName: string; passphrase: string; keyBits?: 2048 | 3072; validityYears?: number; now?: Date }): Buffer {
  // Node's native generator: forge's pure-JS RSA key generation takes seconds for 3072 bits.
  const { privateKey: privatePem, publicKey: publicPem } = generateKeyPairSync('rsa', {
    modulusLength: opts.keyBits ?? 3072,
    publicKeyEncoding: { type: 'spki', format: 'pem' },
    privateKeyEncoding: { type: 'pkcs8', format: 'pem' },
  });
  const privateKey = forge.pki.privateKeyFromPem(privatePem);
  const publicKey = forge.pki.publicKeyFromPem(publicPem);
  const now = opts.now ?? new Date();
  const cert = forge.pki.createCertificate();
  cert.publicKey = publicKey;
  // Positive serial (leading 0x01 keeps the DER INTEGER positive).
  cert.serialNumber = `01${randomBytes(15).toString('hex')}`;
  cert.validity.notBefore = new Date(now.getTime() - 60_000);
  cert.validity.notAfter = new Date(now);
  cert.validity.notAfter.setUTCFullYear(now.getUTCFullYear() + (opts.validityYears ?? 10));
  const attrs = [
    { name: 'commonName', value: opts.labName },
    { name: 'organizationName', value: opts.labName },
  ];
  cert.setSubject(attrs);
  cert.setIssuer(attrs);
  cert.setExtensions([
    { name: 'basicConstraints', cA: false },
    { name: 'keyUsage', digitalSignature: true, nonRepudiation: true },
    { name: 'extKeyUsage', emailProtection: true },
    { name: 'subjectKeyIdentifier' },
  ]);
  cert.sign(privateKey, forge.md.sha256.create());
  const asn1 = forge.pkcs12.toPkcs12Asn1(privateKey, [cert], opts.passphrase, {
    algorithm: '3des',
    friendlyName: opts.labName,
    generateLocalKeyId: true,
  });
  return Buffer.from(forge.asn1.toDer(asn1).getBytes(), 'binary');
}

async function readIfExists(path: string): Promise<Buffer | null> {
  try {
    return await readFile(path);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT') return null;
    throw err;
  }
}

/**
 * Returns the lab's signing identity: the configured P12 when `p12Path` is given, otherwise the
 * self-signed one under `dataDir/signing/`, generating it on first call.
 */
export async function ensureSigningIdentity(options: EnsureSigningIdentityOptions): Promise<SigningIdentity> {
  if (options.p12Path) {
    const p12 = await readIfExists(options.p12Path);
    if (!p12) throw new SigningIdentityError(`The signing P12 was not found at ${options.p12Path}.`);
    return describe(p12, options.passphrase ?? '', 'configured');
  }
  const dir = join(options.dataDir, 'signing');
  const p12File = join(dir, P12_FILE);
  const passFile = join(dir, PASS_FILE);
  const existing = await readIfExists(p12File);
  if (existing) {
    const pass = await readIfExists(passFile);
    if (pass === null) throw new SigningIdentityError(`${p12File} exists but its passphrase file ${passFile} is missing.`);
    return describe(existing, pass.toString('utf8').trim(), 'existing');
  }
  await mkdir(dir, { recursive: true, mode: 0o700 });
  const passphrase = randomBytes(24).toString('base64url');
  const p12 = createSelfSignedP12({
    labName: options.labName ?? 'Emberline laboratory',
    passphrase,
    keyBits: options.keyBits,
    validityYears: options.validityYears,
    now: options.now?.(),
  });
  // Passphrase first: a P12 without its passphrase would be useless after a crash in between.
  await writeFile(passFile, `${passphrase}\n`, { mode: 0o600, flag: 'wx' });
  await writeFile(p12File, p12, { mode: 0o600, flag: 'wx' });
  await chmod(passFile, 0o600);
  await chmod(p12File, 0o600);
  return describe(p12, passphrase, 'generated');
}
