/**
 * Renders a calibration certificate to PDF bytes (unsigned; see ../signing/sign-pdf.ts).
 * CPU-bound: the server calls it through the worker pool (../workers/pool.ts), tests may call it directly.
 */
import { createElement } from 'react';
import { renderToBuffer } from '@react-pdf/renderer';
import { certificateSchema, type CertificateData } from '../../shared/schemas/certificate.schema';
import { CertificateDocument } from './certificate-document';
import { registerCertificateFonts } from './fonts';

export async function renderCertificatePdf(data: CertificateData): Promise<Buffer> {
  registerCertificateFonts();
  // Parse again: the data may have crossed a worker boundary or come from stored JSON.
  const parsed = certificateSchema.parse(data);
  return renderToBuffer(createElement(CertificateDocument, { data: parsed }) as Parameters<typeof renderToBuffer>[0]);
}
