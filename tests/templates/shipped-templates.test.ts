/**
 * Every shipped template (templates/*.json) is a valid template document, its model passes the
 * engine's checks (symbols, units) and evaluates at its defaults, and its reference case — values
 * computed independently with mpmath by tests/fixtures/templates/reference_cases.py — reproduces
 * within the template's own tolerance (ISO/IEC 17025:2017 §7.2.2, validation of methods).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { budgetFromTemplate, templateDefinitionSchema } from '../../shared/schemas/template.schema';
import { checkUnits, evaluateGum } from '../../shared/engine';

const dir = join(import.meta.dirname, '../../templates');
const files = readdirSync(dir).filter((f) => f.endsWith('.json')).sort();

describe('shipped templates', () => {
  it('ships at least the five radiometric templates of issue 4', () => {
    expect(files).toEqual(expect.arrayContaining([
      'ir-thermometer-blackbody.json',
      'blackbody-spectral-radiance.json',
      'transfer-thermometer-sakuma-hattori.json',
      'grey-body-exitance.json',
      'radiance-temperature-known-emissivity.json',
    ]));
  });

  for (const file of files) {
    describe(file, () => {
      const raw = JSON.parse(readFileSync(join(dir, file), 'utf8'));
      const parsed = templateDefinitionSchema.safeParse(raw);

      it('is a valid template document', () => {
        expect(parsed.success ? [] : parsed.error.issues).toEqual([]);
      });

      it('names its published sources and marks its demo magnitudes as invented', () => {
        expect(raw.sources?.length).toBeGreaterThan(0);
        expect(raw.demoNote).toMatch(/invented/);
      });

      it('has consistent units', () => {
        const t = templateDefinitionSchema.parse(raw);
        const check = checkUnits(budgetFromTemplate(t));
        expect(check.errors).toEqual([]);
      });

      it('reproduces its reference case (independent mpmath computation) within its tolerance', () => {
        const t = templateDefinitionSchema.parse(raw);
        const ref = t.referenceCase!;
        const gum = evaluateGum(budgetFromTemplate(t, ref.inputs ?? {})).gum;
        const tolY = Math.max(ref.tolerance.yAbs ?? 0, (ref.tolerance.yRel ?? 0) * Math.abs(ref.expected.y));
        expect(Math.abs(gum.y - ref.expected.y)).toBeLessThanOrEqual(tolY);
        expect(Math.abs(gum.u - ref.expected.u) / ref.expected.u).toBeLessThanOrEqual(ref.tolerance.uRel);
      });
    });
  }
});
