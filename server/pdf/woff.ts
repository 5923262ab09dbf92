/**
 * WOFF 1.0 → plain sfnt (TrueType/OpenType) conversion, done once per font file.
 *
 * Why: fontkit reads a WOFF font by inflating a table every time it is read, so laying out a
 * certificate spent most of its time in zlib (seconds per PDF with the large DejaVu fallback).
 * A decompressed sfnt is read in place. Format: W3C "WOFF File Format 1.0" (2012), §3–§5: a
 * 44-byte header, 20-byte table directory entries (tag, offset, compLength, origLength,
 * origChecksum), each table zlib-compressed when compLength < origLength. The sfnt written here
 * has the offset table and 16-byte table records of the OpenType specification, tables 4-byte
 * aligned, in the (sorted) order of the WOFF directory; checksums are the WOFF's origChecksum
 * (./sfnt.ts writes it).
 */
import { inflateSync } from 'node:zlib';
import { writeSfnt } from './sfnt';

const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'

export function woffToSfnt(woff: Buffer): Buffer {
  if (woff.length < 44 || woff.readUInt32BE(0) !== WOFF_SIGNATURE) throw new Error('Not a WOFF 1.0 font');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + i * 20;
    const tag = woff.readUInt32BE(at);
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const checksum = woff.readUInt32BE(at + 16);
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw) : raw;
    if (data.length !== origLength) throw new Error('WOFF table length mismatch');
    return { tag, checksum, data };
  });
  return writeSfnt(flavor, tables);
}
