/**
 * Rendering through the piscina pool under tsx (../shared/STACK-NOTES.md #7): the .mjs bootstrap
 * registers tsx in the worker thread and loads server/workers/pdf.worker.ts.
 */
import { afterAll, describe, expect, it } from 'vitest';
import { createWorkerPool } from '../../../server/workers/pool';
import { demoCertificate } from '../../fixtures/certificates/demo-certificate';
import { pageCount, pageTexts, tempDir, writeTemp } from './poppler';

const pool = createWorkerPool({ maxThreads: 1 });
afterAll(() => pool.destroy());

describe('worker pool', () => {
  it('when a certificate is rendered in a worker thread, then the bytes are a valid PDF with the certificate number on every page (ISO/IEC 17025:2017 7.8.2.1 d)', async () => {
    const pdf = await pool.renderCertificate(demoCertificate);
    expect(Buffer.isBuffer(pdf)).toBe(true);
    expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const path = writeTemp(tempDir(), 'pool.pdf', pdf);
    const n = pageCount(path);
    expect(n).toBeGreaterThanOrEqual(2);
    pageTexts(path).forEach((p, i) => {
      expect(p).toContain(demoCertificate.certificateNumber);
      expect(p).toContain(`Page ${i + 1} of ${n}`);
    });
    // A cold worker compiles the module graph with tsx first: generous limit for loaded machines.
  }, 180_000);

  it('when a task name is unknown, then it is refused with a message', async () => {
    await expect(pool.runTask('no-such-task' as never, {})).rejects.toThrow(/Unknown worker task/);
  });

  it('when the payload is not a certificate, then the worker rejects with the validation error', async () => {
    await expect(pool.runTask('render-certificate', { certificateNumber: '' })).rejects.toThrow();
  });
});
