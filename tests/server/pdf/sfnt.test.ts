/**
 * The certificate's fonts: each face under a PostScript name of its own (server/pdf/sfnt.ts,
 * server/pdf/fonts.ts). Structure and checksums as the OpenType specification 1.9 defines them
 * ("The OpenType font file": table checksums, head.checkSumAdjustment; "name": name ID 6).
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { describe, expect, it } from 'vitest';
import { certificateFontFaces } from '../../../server/pdf/fonts';
import { readName, readPostScriptName, readSfnt, tableChecksum, withPostScriptName } from '../../../server/pdf/sfnt';
import { woffToSfnt } from '../../../server/pdf/woff';

const require = createRequire(import.meta.url);
const sfntOf = (file: string) => woffToSfnt(readFileSync(require.resolve(`@fontsource/noto-sans/files/${file}`)));
const tag = (s: string) => Buffer.from(s, 'latin1').readUInt32BE(0);

describe('PostScript names of the @fontsource faces', () => {
  it('names the Latin and the Greek subset of a face alike, the reason each needs a name of its own', () => {
    expect(readPostScriptName(sfntOf('noto-sans-latin-400-italic.woff'))).toBe('NotoSans-Italic');
    expect(readPostScriptName(sfntOf('noto-sans-greek-400-italic.woff'))).toBe('NotoSans-Italic');
  });
});

describe('withPostScriptName', () => {
  const original = sfntOf('noto-sans-greek-400-italic.woff');
  const renamed = withPostScriptName(original, 'NotoSansGreek-Italic');

  it('gives the font the new name and leaves every table but name and head as it was', () => {
    expect(readPostScriptName(renamed)).toBe('NotoSansGreek-Italic');
    const before = readSfnt(original);
    const after = readSfnt(renamed);
    expect(after.flavor).toBe(before.flavor);
    expect(after.tables.map((t) => t.tag)).toEqual(before.tables.map((t) => t.tag));
    after.tables.forEach((t, i) => {
      if (t.tag === tag('name') || t.tag === tag('head')) return;
      expect(t.data.equals(before.tables[i].data)).toBe(true);
      expect(t.checksum).toBe(before.tables[i].checksum);
    });
  });

  it('keeps the other names: their strings stay where they were, the new one is appended', () => {
    for (const id of [1, 2, 3, 4]) expect(readName(renamed, id), `name ID ${id}`).toBe(readName(original, id));
    expect(readName(renamed, 1)).toBe('Noto Sans');
    const oldName = readSfnt(original).tables.find((t) => t.tag === tag('name'))!.data;
    const newName = readSfnt(renamed).tables.find((t) => t.tag === tag('name'))!.data;
    const storage = oldName.readUInt16BE(4);
    expect(newName.subarray(storage, oldName.length).equals(oldName.subarray(storage))).toBe(true);
    // UTF-16BE for the Windows records and one byte a character for Macintosh ones.
    expect(newName.length).toBe(oldName.length + 3 * 'NotoSansGreek-Italic'.length);
  });

  it('writes the name table checksum and head.checkSumAdjustment again (the whole font sums to 0xB1B0AFBA)', () => {
    const { tables } = readSfnt(renamed);
    const name = tables.find((t) => t.tag === tag('name'))!;
    expect(name.checksum).toBe(tableChecksum(name.data));
    expect(tableChecksum(renamed)).toBe(0xb1b0afba);
    // head.checkSumAdjustment only changed in head (its directory checksum is taken with the field at 0).
    const headBefore = readSfnt(original).tables.find((t) => t.tag === tag('head'))!.data;
    const headAfter = tables.find((t) => t.tag === tag('head'))!.data;
    expect(Buffer.concat([headAfter.subarray(0, 8), headAfter.subarray(12)]).equals(Buffer.concat([headBefore.subarray(0, 8), headBefore.subarray(12)]))).toBe(true);
  });

  it('refuses a name that is not a PostScript name (at most 63 printable ASCII characters, none of [](){}<>/%)', () => {
    expect(() => withPostScriptName(original, 'Noto Sans')).toThrow(/not a valid PostScript name/);
    expect(() => withPostScriptName(original, 'Noto/Sans')).toThrow(/not a valid PostScript name/);
    expect(() => withPostScriptName(original, 'N'.repeat(64))).toThrow(/not a valid PostScript name/);
    expect(() => withPostScriptName(original, '')).toThrow(/not a valid PostScript name/);
  });
});

describe('certificateFontFaces', () => {
  const faces = certificateFontFaces();

  it('gives every face a PostScript name no other face has, after its family', () => {
    const names = faces.map((f) => f.postscriptName);
    expect(new Set(names).size).toBe(names.length);
    for (const f of faces) {
      expect(readPostScriptName(f.sfnt)).toBe(f.postscriptName);
      expect(f.postscriptName.startsWith(f.family.replace(/ /g, ''))).toBe(true);
    }
  });

  it('renames only the faces whose @fontsource name another face already has', () => {
    const byFace = (family: string, fontWeight: number, fontStyle: string) =>
      faces.find((f) => f.family === family && f.fontWeight === fontWeight && f.fontStyle === fontStyle)?.postscriptName;
    expect(byFace('Noto Sans', 400, 'italic')).toBe('NotoSans-Italic');
    expect(byFace('Noto Sans Greek', 400, 'italic')).toBe('NotoSansGreek-Italic');
    expect(byFace('Noto Sans Greek', 700, 'italic')).toBe('NotoSansGreek-BoldItalic');
    expect(byFace('Noto Sans Mono Greek', 400, 'normal')).toBe('NotoSansMonoGreek-Regular');
    expect(byFace('DejaVu Sans', 400, 'normal')).toBe('DejaVuSans');
  });
});
