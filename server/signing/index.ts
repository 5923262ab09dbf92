export { sha256Hex } from './hash';
export { createSelfSignedP12, ensureSigningIdentity, SigningIdentityError, type EnsureSigningIdentityOptions, type SigningIdentity } from './identity';
export { signPdf, type SignatureInfo } from './sign-pdf';
export { verifyPdfAuthenticity, type VerificationResult } from './verify';
