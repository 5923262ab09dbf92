/**
 * The annex's "Model:" line as rendered (server/pdf/equation-text.tsx): the body font, not the
 * monospaced one, and a long equation broken only after an operator. Checked with poppler-utils.
 */
import { createElement as h } from 'react';
import { Document, Page, renderToBuffer } from '@react-pdf/renderer';
import { beforeAll, describe, expect, it } from 'vitest';
import { ModelEquations } from '../../../server/pdf/equation-text';
import { registerCertificateFonts } from '../../../server/pdf/fonts';
import { fonts, pageTexts, tempDir, writeTemp } from './poppler';

const LONG =
  'L_seen = eps_bb * planck(lambda_eff, T_bb) + (1 - eps_bb) * planck(lambda_eff, T_amb) + (1 - eps_bb) * (1 - eps_set) * planck(lambda_eff, T_amb) - dL_stray';

async function render(name: string, equations: string[], width: number): Promise<string> {
  registerCertificateFonts();
  const doc = h(Document, null, h(Page, { size: [width, 400], style: { padding: 10, fontSize: 8 } }, h(ModelEquations, { equations, inputs: [] })));
  return writeTemp(dir, name, await renderToBuffer(doc as Parameters<typeof renderToBuffer>[0]));
}

let dir: string;
beforeAll(() => {
  dir = tempDir();
});

describe('the model line of the annex', () => {
  it('is set in Noto Sans, upright and italic, with no monospaced face', async () => {
    const path = await render('model.pdf', ['T_bb = T_ref + dT_unif + dT_stab', 'E = T_ind + dT_res - T_bb'], 500);
    const names = fonts(path).map((f) => f.name.replace(/^[A-Z]{6}\+/, ''));
    expect(names).toContain('NotoSans-Regular');
    expect(names).toContain('NotoSans-Italic');
    expect(names).toContain('NotoSansGreek-Italic'); // δ
    expect(names.filter((n) => /Mono/.test(n))).toEqual([]);
    // pdftotext gives a lowered subscript back right after its base.
    expect(pageTexts(path)[0]).toMatch(/Model:\s+Tbb = Tref \+ δTunif \+ δTstab;\s+E = Tind \+ δTres − Tbb/);
  }, 60_000);

  it('breaks a long equation after an operator, never inside a symbol or with a hyphen (common practice, no source)', async () => {
    const path = await render('long.pdf', [LONG], 240);
    const lines = pageTexts(path)[0].split('\n').map((l) => l.trim()).filter(Boolean);
    expect(lines.length).toBeGreaterThanOrEqual(3);
    expect(lines[0]).toMatch(/^Model:\s+Lseen = /);
    lines.slice(0, -1).forEach((line) => expect(line, line).toMatch(/[+−·]$/));
    expect(lines.at(-1)).toMatch(/δLstray$/);
    // Every symbol whole: no "T-" / "ref" split at the change from base to subscript.
    const joined = lines.join(' ');
    for (const s of ['εbb', 'λeff', 'Tbb', 'Tamb', 'εset']) expect(joined).toContain(s);
    expect(joined).not.toMatch(/-\s/);
  }, 60_000);

  it('prints an equation that is not "symbol = expression" as written, in the body font', async () => {
    const path = await render('as-written.pdf', ['y = a > b ? 1 : 2'], 300);
    expect(pageTexts(path)[0].replace(/\s+/g, '')).toContain('y=a>b?1:2');
    expect(fonts(path).map((f) => f.name).filter((n) => /Mono/.test(n))).toEqual([]);
  }, 60_000);
});
