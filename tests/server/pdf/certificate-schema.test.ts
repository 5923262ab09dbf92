/** The certificate contract (shared/schemas/certificate.schema.ts). */
import { describe, expect, it } from 'vitest';
import { certificateSchema, DEFAULT_STATEMENTS } from '../../../shared/schemas/certificate.schema';
import { demoCertificateInput } from '../../fixtures/certificates/demo-certificate';

describe('certificateSchema', () => {
  it('when statements are omitted, then the ISO/IEC 17025:2017 7.8.2.1 l) and reproduction statements are supplied', () => {
    const { statements: _s, ...rest } = demoCertificateInput;
    const parsed = certificateSchema.parse(rest);
    expect(parsed.statements.relatesOnlyToItem).toBe(DEFAULT_STATEMENTS.relatesOnlyToItem);
    expect(parsed.statements.reproduceInFull).toBe(DEFAULT_STATEMENTS.reproduceInFull);
    expect(parsed.statements.deviations).toEqual([]);
  });

  it('when a required item is missing (7.8.2.1 o: the authorising person), then parsing fails naming it', () => {
    const { signatory: _s, ...rest } = demoCertificateInput;
    const r = certificateSchema.safeParse(rest);
    expect(r.success).toBe(false);
    expect(r.error?.issues.some((i) => i.path[0] === 'signatory')).toBe(true);
  });

  it('when a histogram has as many edges as counts, then it is refused', () => {
    const bad = structuredClone(demoCertificateInput);
    const mcm = bad.results[0].annex!.mcm!;
    mcm.histogram.edges = mcm.histogram.edges.slice(0, -1);
    expect(certificateSchema.safeParse(bad).success).toBe(false);
  });

  it('budget rows accept the engine shape: dof as a number or "infinite" (JSON has no ∞)', () => {
    const rows = certificateSchema.parse(demoCertificateInput).results[0].annex!.gum.budget;
    expect(rows.map((r) => r.dof)).toContain('infinite');
    expect(rows.some((r) => typeof r.dof === 'number')).toBe(true);
  });
});
