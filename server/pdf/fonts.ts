/**
 * Fonts of the certificate PDF, embedded as subsets by react-pdf.
 *
 * - @fontsource ships .woff and .woff2; react-pdf's fontkit crashes on .woff2, so only .woff is
 *   used (../shared/STACK-NOTES.md #4).
 * - Each @fontsource file is one Unicode subset. Latin lacks Greek; Greek lacks the Latin-1
 *   signs; neither has U+207B ⁻, U+2070/U+2074–U+2079 superscript digits or U+2248 ≈. A missing
 *   glyph prints as garbage without an error, so every text style uses a family fallback array:
 *   Noto Sans Latin → Noto Sans Greek → DejaVu Sans (which covers the rest).
 * - Files are resolved with createRequire so that they are found both under tsx and from the
 *   esbuild bundle in dist/ (node_modules stays beside the project in both cases).
 * - Each .woff is unpacked to a plain sfnt once and handed to react-pdf as a data URL: fontkit
 *   re-inflates WOFF tables on every read, which made a render take seconds (see ./woff.ts).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { Font } from '@react-pdf/renderer';
import { woffToSfnt } from './woff';

const require = createRequire(import.meta.url);

type Style = 'normal' | 'italic';
interface Face { file: string; fontWeight: 400 | 700; fontStyle: Style }

function faces(pkg: string, prefix: string, weights: Array<400 | 700>, styles: Style[]): Face[] {
  return weights.flatMap((fontWeight) =>
    styles.map((fontStyle) => ({ file: `${pkg}/files/${prefix}-${fontWeight}-${fontStyle}.woff`, fontWeight, fontStyle })),
  );
}

const FAMILIES: Record<string, Face[]> = {
  'Noto Sans': faces('@fontsource/noto-sans', 'noto-sans-latin', [400, 700], ['normal', 'italic']),
  'Noto Sans Greek': faces('@fontsource/noto-sans', 'noto-sans-greek', [400, 700], ['normal', 'italic']),
  'Noto Sans Mono': faces('@fontsource/noto-sans-mono', 'noto-sans-mono-latin', [400, 700], ['normal']),
  'Noto Sans Mono Greek': faces('@fontsource/noto-sans-mono', 'noto-sans-mono-greek', [400, 700], ['normal']),
  'DejaVu Sans': faces('@fontsource/dejavu-sans', 'dejavu-sans-latin', [400, 700], ['normal', 'italic']),
};

/** Text: Noto Sans with Greek and a last-resort fallback for superscripts and ≈. */
export const SANS = ['Noto Sans', 'Noto Sans Greek', 'DejaVu Sans'];
/** Numeric columns: monospaced (tabular) figures. Noto Sans Mono has no italic: symbols use SANS. */
export const MONO = ['Noto Sans Mono', 'Noto Sans Mono Greek', 'Noto Sans', 'Noto Sans Greek', 'DejaVu Sans'];

let registered = false;

function sfntDataUrl(woffPath: string): string {
  return `data:font/ttf;base64,${woffToSfnt(readFileSync(woffPath)).toString('base64')}`;
}

/** Registers the families once per process (worker threads each register their own). */
export function registerCertificateFonts(): void {
  if (registered) return;
  for (const [family, list] of Object.entries(FAMILIES)) {
    Font.register({
      family,
      fonts: list.map((f) => ({ src: sfntDataUrl(require.resolve(f.file)), fontWeight: f.fontWeight, fontStyle: f.fontStyle })),
    });
  }
  // Certificates break words only at spaces: no automatic hyphenation of names or serial numbers.
  Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}
