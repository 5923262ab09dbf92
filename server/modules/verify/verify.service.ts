/**
 * Public verification of a certificate (no sign-in). A PDF is authentic when the SHA-256 of its
 * exact bytes equals the hash recorded at issue (server/signing/verify.ts); a number is looked up
 * as typed. The answer reveals the certificate's own header only — number, issue date, lab,
 * customer organisation — and its status, never results, people or files.
 */
import { verifyPdfAuthenticity } from '../../signing';
import type { CertificateData } from '../../../shared/schemas/certificate.schema';
import type { PublicCertificate, VerifyFileResponse, VerifyNumberResponse } from '../../../shared/schemas/certificates-api.schema';
import type { CertificateRecord, CertificatesRepository } from '../certificates/certificates.repository';

export function createVerifyService(deps: { certificatesRepo: CertificatesRepository }) {
  const repo = deps.certificatesRepo;

  async function header(c: CertificateRecord): Promise<PublicCertificate> {
    const data = c.data as CertificateData;
    const numbers = await repo.numbersOf(c.supersededById ? [c.supersededById] : []);
    return {
      number: c.number,
      issueDate: data.dates.issue,
      lab: data.lab.name,
      customer: data.customer.organisation,
      status: c.status,
      supersededBy: c.supersededById ? (numbers.get(c.supersededById) ?? null) : null,
      withdrawnOn: c.withdrawnAt ? c.withdrawnAt.toISOString().slice(0, 10) : null,
    };
  }

  return {
    async verifyFile(bytes: Uint8Array): Promise<VerifyFileResponse> {
      const result = await verifyPdfAuthenticity(bytes, (sha) => repo.getByHash(sha));
      return { authentic: result.authentic, sha256: result.sha256, certificate: result.record ? await header(result.record) : null };
    },

    async verifyNumber(number: string): Promise<VerifyNumberResponse> {
      const c = await repo.getByNumber(number.trim().toUpperCase());
      return { found: Boolean(c), certificate: c ? await header(c) : null };
    },
  };
}

export type VerifyService = ReturnType<typeof createVerifyService>;
