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
 * - Every face gets a PostScript name of its own, the registered family's name without spaces
 *   before the style ("NotoSansGreek-Italic"): @fontsource names its Latin and Greek subsets
 *   alike ("NotoSans-Italic"). pdfkit 0.20 (which react-pdf 4 renders with) finds an embedded
 *   font again by its PostScript name only; a second font under a name already taken is opened,
 *   subset and embedded anew on every text run (PDFDocument.font, `_fontFamilies`), so a
 *   certificate carried some twenty NotoSans-Italic subsets, one per Greek italic symbol.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { Font } from '@react-pdf/renderer';
import { readPostScriptName, withPostScriptName } from './sfnt';
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

/**
 * The face as a plain sfnt named after its family: 'Noto Sans Greek' and "NotoSans-Italic" give
 * "NotoSansGreek-Italic"; a name that already reads so ("NotoSans-Italic", "DejaVuSans-Bold") is
 * left as it is.
 */
function faceSfnt(family: string, face: Face): { sfnt: Buffer; postscriptName: string } {
  const sfnt = woffToSfnt(readFileSync(require.resolve(face.file)));
  const original = readPostScriptName(sfnt);
  if (!original) throw new Error(`${face.file} has no PostScript name`);
  const dash = original.indexOf('-');
  const postscriptName = `${family.replace(/ /g, '')}${dash < 0 ? '' : original.slice(dash)}`;
  return { sfnt: postscriptName === original ? sfnt : withPostScriptName(sfnt, postscriptName), postscriptName };
}

/** Each face of each family, with a PostScript name no other face has. */
export function certificateFontFaces(): Array<Face & { family: string; sfnt: Buffer; postscriptName: string }> {
  const list = Object.entries(FAMILIES).flatMap(([family, faceList]) => faceList.map((face) => ({ ...face, family, ...faceSfnt(family, face) })));
  const seen = new Set<string>();
  for (const f of list) {
    if (seen.has(f.postscriptName)) throw new Error(`Two certificate font faces are both named ${f.postscriptName}`);
    seen.add(f.postscriptName);
  }
  return list;
}

/** Registers the families once per process (worker threads each register their own). */
export function registerCertificateFonts(): void {
  if (registered) return;
  const all = certificateFontFaces();
  for (const family of Object.keys(FAMILIES)) {
    Font.register({
      family,
      fonts: all
        .filter((f) => f.family === family)
        .map((f) => ({ src: `data:font/ttf;base64,${f.sfnt.toString('base64')}`, fontWeight: f.fontWeight, fontStyle: f.fontStyle })),
    });
  }
  // Certificates break words only at spaces: no automatic hyphenation of names or serial numbers.
  Font.registerHyphenationCallback((word) => [word]);
  registered = true;
}
