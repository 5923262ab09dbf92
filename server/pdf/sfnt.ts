/**
 * The table directory of an sfnt (TrueType/OpenType) font, and its PostScript name.
 *
 * Format: OpenType specification 1.9, "The OpenType font file" (offset table, 16-byte table
 * records, tables 4-byte aligned, table checksums, head.checkSumAdjustment) and "name — Naming
 * table" (format 0 and 1 header, 12-byte name records, string storage; name ID 6 is the
 * PostScript name, UTF-16BE on the Unicode and Windows platforms, one byte per character on
 * the Macintosh platform).
 */

export interface SfntTable {
  /** Four-byte tag as a big-endian number ('name' = 0x6e616d65). */
  tag: number;
  checksum: number;
  data: Buffer;
}

const tagOf = (s: string) => Buffer.from(s, 'latin1').readUInt32BE(0);
const NAME = tagOf('name');
const HEAD = tagOf('head');
const POSTSCRIPT_NAME_ID = 6;
/** head.checkSumAdjustment is 0xB1B0AFBA minus the checksum of the whole font. */
const CHECKSUM_MAGIC = 0xb1b0afba;

const pad4 = (n: number) => (n + 3) & ~3;

/** Sum of the table as big-endian uint32 words, zero-padded to a multiple of four bytes, modulo 2^32. */
export function tableChecksum(data: Buffer): number {
  let sum = 0;
  for (let i = 0; i < data.length; i += 4) {
    const word = i + 4 <= data.length ? data.readUInt32BE(i) : Buffer.concat([data.subarray(i), Buffer.alloc(4)]).readUInt32BE(0);
    sum = (sum + word) >>> 0;
  }
  return sum;
}

export function readSfnt(sfnt: Buffer): { flavor: number; tables: SfntTable[] } {
  if (sfnt.length < 12) throw new Error('Not an sfnt font');
  const numTables = sfnt.readUInt16BE(4);
  if (sfnt.length < 12 + 16 * numTables) throw new Error('Truncated sfnt table directory');
  const tables = Array.from({ length: numTables }, (_, i) => {
    const rec = 12 + i * 16;
    const offset = sfnt.readUInt32BE(rec + 8);
    const length = sfnt.readUInt32BE(rec + 12);
    if (offset + length > sfnt.length) throw new Error('sfnt table beyond the end of the file');
    return { tag: sfnt.readUInt32BE(rec), checksum: sfnt.readUInt32BE(rec + 4), data: sfnt.subarray(offset, offset + length) };
  });
  return { flavor: sfnt.readUInt32BE(0), tables };
}

/** Writes the offset table, the table records (checksums as given) and the tables, in the given order. */
export function writeSfnt(flavor: number, tables: readonly SfntTable[]): Buffer {
  const numTables = tables.length;
  const headerSize = 12 + 16 * numTables;
  const total = tables.reduce((sum, t) => sum + pad4(t.data.length), headerSize);
  const out = Buffer.alloc(total);
  let pow2 = 1;
  while (pow2 * 2 <= numTables) pow2 *= 2;
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(pow2 * 16, 6); // searchRange
  out.writeUInt16BE(Math.log2(pow2), 8); // entrySelector
  out.writeUInt16BE(numTables * 16 - pow2 * 16, 10); // rangeShift
  let offset = headerSize;
  tables.forEach((t, i) => {
    const rec = 12 + i * 16;
    out.writeUInt32BE(t.tag, rec);
    out.writeUInt32BE(t.checksum, rec + 4);
    out.writeUInt32BE(offset, rec + 8);
    out.writeUInt32BE(t.data.length, rec + 12);
    t.data.copy(out, offset);
    offset += pad4(t.data.length);
  });
  return out;
}

function nameTable(tables: readonly SfntTable[]): Buffer {
  const table = tables.find((t) => t.tag === NAME)?.data;
  if (!table || table.length < 6) throw new Error('The font has no name table');
  return table;
}

/** The first string of name ID `nameId` (1 family, 2 subfamily, 4 full name, 6 PostScript name …), or null. */
export function readName(sfnt: Buffer, nameId: number): string | null {
  const table = nameTable(readSfnt(sfnt).tables);
  const count = table.readUInt16BE(2);
  const storage = table.readUInt16BE(4);
  for (let i = 0; i < count; i++) {
    const rec = 6 + 12 * i;
    if (table.readUInt16BE(rec + 6) !== nameId) continue;
    const platform = table.readUInt16BE(rec);
    const start = storage + table.readUInt16BE(rec + 10);
    const bytes = Buffer.from(table.subarray(start, start + table.readUInt16BE(rec + 8)));
    return platform === 1 ? bytes.toString('latin1') : bytes.swap16().toString('utf16le');
  }
  return null;
}

/** The font's PostScript name (name ID 6), or null when it has none. */
export function readPostScriptName(sfnt: Buffer): string | null {
  return readName(sfnt, POSTSCRIPT_NAME_ID);
}

/**
 * The same font with another PostScript name: every name ID 6 record points at the new name,
 * appended to the string storage (the other strings stay where they were, so name records that
 * share a string and format 1 language tags keep their offsets). The name table's checksum and
 * head.checkSumAdjustment are computed again; every other table is copied unchanged.
 */
export function withPostScriptName(sfnt: Buffer, postscriptName: string): Buffer {
  // name ID 6: at most 63 printable ASCII characters, none of [ ] ( ) { } < > / %.
  if (!/^[\x21-\x7e]{1,63}$/.test(postscriptName) || /[[\](){}<>/%]/.test(postscriptName)) {
    throw new Error(`"${postscriptName}" is not a valid PostScript name`);
  }
  const { flavor, tables } = readSfnt(sfnt);
  const table = nameTable(tables);
  const count = table.readUInt16BE(2);
  const storage = table.readUInt16BE(4);
  const head = Buffer.from(table.subarray(0, storage));
  const strings = table.subarray(storage);
  const utf16 = Buffer.from(postscriptName, 'utf16le').swap16();
  const oneByte = Buffer.from(postscriptName, 'latin1');
  const utf16At = strings.length;
  const oneByteAt = utf16At + utf16.length;
  if (oneByteAt + oneByte.length > 0xffff) throw new Error('The name table has no room for another string');
  let renamed = 0;
  for (let i = 0; i < count; i++) {
    const rec = 6 + 12 * i;
    if (head.readUInt16BE(rec + 6) !== POSTSCRIPT_NAME_ID) continue;
    const macintosh = head.readUInt16BE(rec) === 1;
    head.writeUInt16BE(macintosh ? oneByte.length : utf16.length, rec + 8);
    head.writeUInt16BE(macintosh ? oneByteAt : utf16At, rec + 10);
    renamed += 1;
  }
  if (renamed === 0) throw new Error('The font has no PostScript name record');
  const name = Buffer.concat([head, strings, utf16, oneByte]);

  const headIndex = tables.findIndex((t) => t.tag === HEAD);
  const out = writeSfnt(
    flavor,
    tables.map((t) => (t.tag === NAME ? { tag: NAME, checksum: tableChecksum(name), data: name } : t)),
  );
  if (headIndex >= 0) {
    const at = out.readUInt32BE(12 + headIndex * 16 + 8) + 8; // head.checkSumAdjustment
    out.writeUInt32BE(0, at);
    out.writeUInt32BE((CHECKSUM_MAGIC - tableChecksum(out)) >>> 0, at);
  }
  return out;
}
