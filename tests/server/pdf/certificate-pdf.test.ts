/**
 * The certificate PDF: content required by ISO/IEC 17025:2017 §7.8 (items as listed in
 * ../shared/reference/README.md §5), embedded fonts, the PKCS#7 signature and the hash check of
 * the verification page. Checked with poppler-utils (pdftotext, pdffonts, pdfsig, pdfinfo).
 */
import { statSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { symbolText } from '../../../shared/format';
import { certificateSchema } from '../../../shared/schemas/certificate.schema';
import { renderCertificatePdf } from '../../../server/pdf/render-certificate';
import { ensureSigningIdentity, sha256Hex, signPdf, verifyPdfAuthenticity, type SigningIdentity } from '../../../server/signing';
import { demoCertificate, demoCertificateInput } from '../../fixtures/certificates/demo-certificate';
import { fonts, pageCount, pageTexts, pdfsig, tempDir, writeTemp } from './poppler';

const SIGN_INFO = {
  reason: `Calibration certificate ${demoCertificate.certificateNumber}`,
  location: 'Halden Vale (demo)',
  contactInfo: 'certificates@halden-vale.example',
  name: demoCertificate.lab.name,
};

let dir: string;
let unsigned: Buffer;
let unsignedPath: string;
let pages: string[];
let all: string;
let identity: SigningIdentity;
let signed: Buffer;
let signedPath: string;

beforeAll(async () => {
  dir = tempDir();
  unsigned = await renderCertificatePdf(demoCertificate);
  unsignedPath = writeTemp(dir, 'unsigned.pdf', unsigned);
  pages = pageTexts(unsignedPath);
  all = pages.join('\n');
  identity = await ensureSigningIdentity({ dataDir: join(dir, 'data'), labName: demoCertificate.lab.name });
  signed = await signPdf(unsigned, identity, SIGN_INFO);
  signedPath = writeTemp(dir, 'signed.pdf', signed);
}, 180_000);

describe('certificate PDF content (ISO/IEC 17025:2017 7.8.2.1 and 7.8.4.1)', () => {
  it('when rendered for three points, then it is a PDF of two to four pages', () => {
    expect(unsigned.subarray(0, 5).toString('latin1')).toBe('%PDF-');
    const n = pageCount(unsignedPath);
    expect(n).toBeGreaterThanOrEqual(2);
    expect(n).toBeLessThanOrEqual(4);
    expect(pages).toHaveLength(n);
  });

  it('7.8.2.1 d): every page carries the certificate number and "Page x of y"', () => {
    pages.forEach((text, i) => {
      expect(text).toContain(demoCertificate.certificateNumber);
      expect(text).toContain(`Page ${i + 1} of ${pages.length}`);
    });
  });

  it('7.8.2.1 d): the end of the certificate is marked on the last page only', () => {
    expect(pages.at(-1)).toContain('End of certificate');
    pages.slice(0, -1).forEach((p) => expect(p).not.toContain('End of certificate'));
  });

  it('a) title, b) lab name, address and accreditation number, c) location of the activity', () => {
    expect(pages[0]).toContain('Calibration certificate');
    expect(all).toContain(demoCertificate.lab.name);
    expect(all).toContain('12 Lantern Road');
    expect(all).toContain(demoCertificate.lab.accreditationNumber);
    expect(all).toContain(demoCertificate.lab.activityLocation);
  });

  it('e) customer and contact, g) item identification and condition, h)–j) dates', () => {
    expect(all).toContain(demoCertificate.customer.organisation);
    expect(all).toContain(demoCertificate.customer.contact.name);
    expect(all).toContain(demoCertificate.item.serialNumber);
    expect(all).toContain(demoCertificate.item.model);
    expect(all).toContain('Received in its case, undamaged');
    expect(all).toContain('16 November 2026'); // receipt
    expect(all).toContain('19 to 20 November 2026'); // calibration range
    expect(all).toContain('24 November 2026'); // issue
  });

  it('f) method: template name and version', () => {
    expect(all).toContain(`${demoCertificate.method.templateName}, version ${demoCertificate.method.templateVersion}`);
  });

  it('m) and 7.8.4.1: each result as y ± U unit with k and the coverage probability', () => {
    expect(all).toContain('E = 0.28 ± 0.22 K (k = 2.01, p ≈ 95 %)');
    expect(all).toContain('E = 0.57 ± 0.31 K (k = 2.00, p ≈ 95 %)');
    // JCGM 101:2008 §8: where validation fails the Monte Carlo result is reported, and said so.
    expect(all).toContain('E = 1.22 ± 0.86 K (p ≈ 95 %, Monte Carlo)');
    expect(all).toContain('did not pass the JCGM 101 §8 validation');
  });

  it('7.8.4.1: environmental conditions with their uncertainties', () => {
    expect(all).toContain('23.1 ± 0.5 °C');
    expect(all).toContain('41 ± 5 %rh');
  });

  it('7.8.4.1 and 7.8.6: conformity statement with the specification and the decision rule', () => {
    expect(all).toContain(demoCertificate.conformity!.statement);
    expect(all).toContain('Decision rule');
    expect(all).toContain('ILAC-G8:2019');
    expect(all).toContain('Conforms');
  });

  it('7.8.4.1: traceability statement listing each reference standard and its certificate number', () => {
    expect(all).toContain('metrologically traceable');
    for (const std of demoCertificate.traceability.standards) {
      expect(all).toContain(std.certificateNumber);
      expect(all).toContain(std.serialNumber);
    }
  });

  it('l) results relate only to the item, reproduction in full, n) deviations, o) signatory and function', () => {
    expect(all).toContain('The results relate only to the item calibrated');
    expect(all).toContain('shall not be reproduced except in full');
    expect(all).toContain('Deviations from, additions to or exclusions from the method: None.');
    expect(all).toContain(demoCertificate.signatory.name);
    expect(all).toContain(demoCertificate.signatory.function);
  });

  it('shows the cautions: signatory approval, accreditation rules prevail, no safety assessment', () => {
    expect(all).toContain('valid only after review and approval by an authorised signatory');
    expect(all).toMatch(/accreditation body and local\s+regulations take precedence/);
    expect(all).toMatch(/optical-radiation\s+or thermal safety/);
  });

  it('annex: budget of every point with ν_eff, k, the Monte Carlo interval and the validation result', () => {
    expect(all).toContain('Annex A');
    for (let i = 1; i <= 3; i += 1) expect(all).toContain(`Point ${i} · nominal`);
    expect(all).toContain('Shortest coverage interval');
    expect(all).toContain('Passed: the GUM result is validated.');
    expect(all).toContain('Not passed: the Monte Carlo result is reported.');
    // A count is written out in digit groups (SI Brochure §5.4.4), not as a power of ten.
    // (pdftotext gives the narrow no-break space U+202F back as a plain space.)
    expect(all).toMatch(/1[\u202F ]000[\u202F ]000 trials/);
  });

  it('prints λ, ±, °C, "k =", Greek symbols, superscripts and ≈ as text (the fonts carry them)', () => {
    for (const s of ['λ', '±', '°C', 'k =', 'ν', 'δ', 'ε', 'µm', '≈', '× 10⁻⁴', 'K⁻¹', '−1.00 ']) expect(all).toContain(s);
    expect(all).not.toContain('\uFFFD');
  });

  it('annex: names each input as the review screen does (shared/format/symbols.ts, ISO 80000-1 §7.1)', () => {
    const annexText = pages.slice(1).join('\n');
    for (const row of demoCertificate.results[0].annex!.gum.budget) {
      const { base, sub } = symbolText(row.symbol);
      // pdftotext gives the lowered subscript back right after its base: "δTres", "Tref".
      expect(annexText, row.symbol).toMatch(new RegExp(`^${base}${sub ?? ''}\\s`, 'm'));
    }
    // A leading d is δ before a capital only, on screen and here: dT_res → δT_res, deps stays deps.
    expect(annexText).toMatch(/^δTres\s/m);
    expect(annexText).toMatch(/^deps\s/m);
    expect(annexText).not.toContain('δε');
  });

  it('annex: prints each model with its symbols as the budget rows type them (ISO 80000-1 §7.1), − and · for the operators, no raw identifiers', () => {
    const annexText = pages.slice(2).join('\n');
    // pdftotext gives a lowered subscript back right after its base.
    expect(annexText).toMatch(/Model:\s+Tbb = Tref \+ δTunif \+ δTstab − cε · deps − δTamb − δTsse;\s+E = Tind \+ δTres − Tbb/);
    expect(annexText).not.toMatch(/T_bb|dT_|c_eps/);
  });

  it('keeps the end mark on the page of the last annex point and leaves no page blank, however tall the annex (7.8.2.1 d)', async () => {
    const extra = 'L_seen = eps_bb * planck(lambda_eff, T_bb) + (1 - eps_bb) * planck(lambda_eff, T_amb) + (1 - eps_bb) * (1 - eps_set) * planck(lambda_eff, T_amb) - dL_stray';
    const header = [demoCertificate.lab.name, 'Calibration certificate · Accreditation', 'Reproduce only in full', /Page \d+ of \d+/, demoCertificate.certificateNumber];
    for (let n = 1; n <= 4; n += 1) {
      const results = demoCertificateInput.results.map((r) => ({ ...r, annex: r.annex && { ...r.annex, equations: [...(r.annex.equations ?? []), ...Array<string>(n).fill(extra)] } }));
      const path = writeTemp(dir, `annex-${n}.pdf`, await renderCertificatePdf(certificateSchema.parse({ ...demoCertificateInput, results })));
      const texts = pageTexts(path);
      texts.forEach((text, i) => {
        const body = text.split('\n').filter((line) => line.trim() && !header.some((h) => (typeof h === 'string' ? line.includes(h) : h.test(line))));
        expect(body.length, `${n} extra equations, page ${i + 1} of ${texts.length}`).toBeGreaterThan(0);
      });
      expect(texts.at(-1)).toContain('Point 3 · nominal');
      expect(texts.at(-1)).toContain('End of certificate');
    }
  }, 120_000);

  it('writes a quantity mu with the Greek letter and the prefix micro with the micro sign (SI Brochure §3)', async () => {
    const results = demoCertificateInput.results.map((r) => ({ ...r, measurand: { ...r.measurand, symbol: 'mu_a' } }));
    const path = writeTemp(dir, 'mu.pdf', await renderCertificatePdf(certificateSchema.parse({ ...demoCertificateInput, results })));
    const text = pageTexts(path).join('\n');
    expect(text).toContain('\u03BCa = 0.28 ± 0.22 K');
    expect(text).toContain('8 \u00B5m to 14 \u00B5m');
    expect(text).not.toContain('\u00B5a');
  }, 120_000);

  it('embeds every font (pdffonts: emb = yes), Noto Sans among them', () => {
    const rows = fonts(unsignedPath);
    expect(rows.length).toBeGreaterThan(0);
    for (const row of rows) expect(row, row.name).toMatchObject({ embedded: true });
    expect(rows.some((r) => r.name.includes('NotoSans-Regular'))).toBe(true);
    expect(rows.some((r) => r.type.includes('Type 3'))).toBe(false);
  });

  it('embeds each font face once: one subset per PostScript name, the Greek faces under names of their own', () => {
    // pdfkit finds an embedded font again by its PostScript name only; under a shared name the
    // Greek italic was embedded anew for every run, some twenty NotoSans-Italic subsets.
    const names = fonts(unsignedPath).map((r) => r.name.replace(/^[A-Z]{6}\+/, ''));
    expect(names.filter((n, i) => names.indexOf(n) !== i)).toEqual([]);
    expect(names).toContain('NotoSans-Italic');
    expect(names).toContain('NotoSansGreek-Italic');
  });

  it('7.8.8: an amendment names the certificate it replaces and why', async () => {
    const amended = certificateSchema.parse({
      ...demoCertificateInput,
      certificateNumber: 'HVR-2026-0417-A1',
      amends: { certificateNumber: 'HVR-2026-0417', reason: 'The serial number of the item was misprinted.' },
    });
    const path = writeTemp(dir, 'amended.pdf', await renderCertificatePdf(amended));
    const text = pageTexts(path);
    expect(text[0]).toContain('this certificate replaces certificate HVR-2026-0417.');
    expect(text[0]).toContain('The serial number of the item was misprinted.');
    text.forEach((p) => expect(p).toContain('HVR-2026-0417-A1'));
  }, 120_000);
});

describe('signature and authenticity', () => {
  it('when signed with the self-signed lab identity, then pdfsig reports the signature valid', () => {
    const report = pdfsig(signedPath);
    expect(report).toContain('Signature is Valid.');
    // Expected for a self-signed certificate (../shared/STACK-NOTES.md #5).
    expect(report).toMatch(/Certificate issuer is unknown|Certificate is Trusted/);
    expect(report).toContain(demoCertificate.lab.name);
  });

  it('keeps the generated P12 and its passphrase under DATA_DIR with mode 0600, and reuses them', async () => {
    for (const f of ['lab-signing.p12', 'lab-signing.passphrase']) {
      expect(statSync(join(dir, 'data', 'signing', f)).mode & 0o777).toBe(0o600);
    }
    expect(identity.source).toBe('generated');
    expect(identity.subject).toBe(demoCertificate.lab.name);
    const again = await ensureSigningIdentity({ dataDir: join(dir, 'data'), labName: 'ignored once generated' });
    expect(again.source).toBe('existing');
    expect(again.fingerprint).toBe(identity.fingerprint);
    const years = (identity.notAfter.getTime() - Date.now()) / (365.25 * 24 * 3600 * 1000);
    expect(years).toBeGreaterThan(9.9);
  });

  it('when one byte of the signed file changes, then its SHA-256 differs and it is not authentic', async () => {
    const issued = new Map([[sha256Hex(signed), { certificateNumber: demoCertificate.certificateNumber, status: 'current' }]]);
    const lookup = (hash: string) => issued.get(hash) ?? null;

    const ok = await verifyPdfAuthenticity(signed, lookup);
    expect(ok.authentic).toBe(true);
    expect(ok.record).toEqual({ certificateNumber: demoCertificate.certificateNumber, status: 'current' });

    const tampered = Buffer.from(signed);
    const at = tampered.indexOf(Buffer.from('/Title'));
    tampered[at + 1] ^= 0x01;
    expect(sha256Hex(tampered)).not.toBe(sha256Hex(signed));
    const bad = await verifyPdfAuthenticity(tampered, lookup);
    expect(bad).toEqual({ authentic: false, sha256: sha256Hex(tampered), record: null });
    // The embedded signature no longer matches either.
    expect(pdfsig(writeTemp(dir, 'tampered.pdf', tampered))).not.toContain('Signature is Valid.');
  });

  it('SHA-256 of a known input (FIPS 180-4 example "abc")', () => {
    expect(sha256Hex(Buffer.from('abc'))).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});
