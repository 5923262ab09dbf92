// Contrast of the design tokens, computed per WCAG 2.1 (success criteria 1.4.3 and 1.4.11;
// relative luminance and contrast ratio as defined in its glossary). AA: 4.5:1 for text,
// 3:1 for large text and for focus indicators and other non-text parts.
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';

const css = readFileSync(resolve(process.cwd(), 'src/styles/tokens.css'), 'utf8');
const token = (name: string): string => {
  const m = new RegExp(`--color-${name}:\\s*(#[0-9a-fA-F]{6})`).exec(css);
  if (!m) throw new Error(`token --color-${name} not found`);
  return m[1];
};

function luminance(hex: string): number {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
function contrast(a: string, b: string): number {
  const [l1, l2] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (l1 + 0.05) / (l2 + 0.05);
}

const TEXT_PAIRS: [string, string][] = [
  ['ink', 'surface'], ['ink', 'canvas'], ['ink', 'sunken'], ['ink-muted', 'surface'], ['ink-muted', 'canvas'], ['ink-muted', 'sunken'],
  ['ember', 'surface'], ['ember-strong', 'surface'], ['ember-strong', 'canvas'], ['ember-strong', 'ember-soft'],
  ['night-ink', 'night'], ['night-ink', 'night-raised'], ['night-ink-muted', 'night'], ['night-ink-muted', 'night-raised'],
  ['ok', 'ok-soft'], ['warn', 'warn-soft'], ['danger', 'danger-soft'], ['info', 'info-soft'], ['ink', 'warn-soft'], ['ink', 'danger-soft'],
  ['danger', 'surface'], ['ok', 'surface'], ['warn', 'surface'], ['info', 'surface'],
];

describe('design tokens meet WCAG 2.1 AA contrast', () => {
  for (const [fg, bg] of TEXT_PAIRS) {
    it(`${fg} on ${bg} ≥ 4.5:1`, () => {
      expect(contrast(token(fg), token(bg))).toBeGreaterThanOrEqual(4.5);
    });
  }
  it('white text on the ember button ≥ 4.5:1', () => {
    expect(contrast('#ffffff', token('ember'))).toBeGreaterThanOrEqual(4.5);
  });
  for (const bg of ['surface', 'canvas', 'night', 'night-raised']) {
    it(`focus ring on ${bg} ≥ 3:1`, () => {
      expect(contrast(token('focus'), token(bg))).toBeGreaterThanOrEqual(3);
    });
  }
  it('field borders (line-strong) on surface ≥ 3:1', () => {
    expect(contrast(token('line-strong'), token('surface'))).toBeGreaterThanOrEqual(3);
  });
});
