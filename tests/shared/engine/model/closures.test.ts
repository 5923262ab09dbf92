/**
 * The closure evaluator (used where a Content-Security-Policy without 'unsafe-eval' forbids
 * `new Function`, as the app's own page policy does) gives the same values and sensitivity
 * coefficients as the generated code, on every shipped template. Reference: the generated code
 * of the same engine, whose values the template tests check against an independent mpmath
 * computation (tests/fixtures/templates/reference_cases.py).
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { compileModelWith } from '../../../../shared/engine/model';
import { defaultLibrary } from '../../../../shared/engine/model/library';
import { summarizeInput } from '../../../../shared/engine/distributions';
import { budgetFromTemplate, templateDefinitionSchema } from '../../../../shared/schemas/template.schema';

const dir = join(import.meta.dirname, '../../../../templates');

describe('closure evaluation without code generation', () => {
  for (const file of readdirSync(dir).filter((f) => f.endsWith('.json'))) {
    it(`${file}: same measurand value, sensitivities and kernel output as the generated code`, () => {
      const doc = budgetFromTemplate(templateDefinitionSchema.parse(JSON.parse(readFileSync(join(dir, file), 'utf8'))));
      const generated = compileModelWith(doc, defaultLibrary);
      const closures = compileModelWith(doc, defaultLibrary, { codegen: false });
      expect(closures.source.scalar).toBe(generated.source.scalar);
      const x = doc.inputs.map((i) => summarizeInput(i).estimate);
      const u = doc.inputs.map((i) => summarizeInput(i).u);
      expect(closures.scalar(x)).toBe(generated.scalar(x));
      const a = generated.sensitivities(x, u);
      const b = closures.sensitivities(x, u);
      expect(b.method).toEqual(a.method);
      b.c.forEach((c, i) => expect(c).toBeCloseTo(a.c[i], 12));
      const cols = x.map((v) => Float64Array.from([v, v * (1 + 1e-6)]));
      const outA = new Float64Array(2);
      const outB = new Float64Array(2);
      generated.kernel(cols, outA, 2);
      closures.kernel(cols, outB, 2);
      expect(Array.from(outB)).toEqual(Array.from(outA));
    });
  }
});
