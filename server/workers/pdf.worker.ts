/**
 * Worker entry for PDF rendering (bundled by server/build.mjs to dist/server/workers/pdf.worker.js).
 * react-pdf layout is CPU-bound and synchronous in places: off the main thread it does not stall requests.
 */
import { renderCertificatePdf } from '../pdf/render-certificate';
import { certificateSchema } from '../../shared/schemas/certificate.schema';
import { taskHandler } from './task-handler';

export default taskHandler({
  'render-certificate': async (payload: unknown): Promise<Uint8Array> => {
    const pdf = await renderCertificatePdf(certificateSchema.parse(payload));
    // A plain Uint8Array crosses the thread boundary by structured clone; the caller wraps it in a Buffer.
    return new Uint8Array(pdf.buffer, pdf.byteOffset, pdf.byteLength);
  },
});
