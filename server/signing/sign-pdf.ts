/**
 * PKCS#7 detached signature (adbe.pkcs7.detached) over the PDF byte ranges, with the lab's P12.
 * ../shared/STACK-NOTES.md #5: plainAddPlaceholder, then `new SignPdf().sign(pdf, P12Signer)`.
 */
import { plainAddPlaceholder } from '@signpdf/placeholder-plain';
import { P12Signer } from '@signpdf/signer-p12';
import { SignPdf } from '@signpdf/signpdf';
import type { SigningIdentity } from './identity';

export interface SignatureInfo {
  reason: string;
  location: string;
  contactInfo: string;
  /** Name of the signer shown by PDF readers (the lab or the signatory). */
  name: string;
  signingTime?: Date;
}

/** Room for the CMS structure: certificate (≈1.5 kB for RSA-3072) + signature; hex doubles it. */
const SIGNATURE_LENGTH = 8192;

export async function signPdf(pdf: Buffer, identity: Pick<SigningIdentity, 'p12' | 'passphrase'>, info: SignatureInfo): Promise<Buffer> {
  const withPlaceholder = plainAddPlaceholder({
    pdfBuffer: pdf,
    reason: info.reason,
    location: info.location,
    contactInfo: info.contactInfo,
    name: info.name,
    signatureLength: SIGNATURE_LENGTH,
    ...(info.signingTime ? { signingTime: info.signingTime } : {}),
  });
  const signer = new P12Signer(identity.p12, { passphrase: identity.passphrase });
  return new SignPdf().sign(withPlaceholder, signer, info.signingTime);
}
