/**
 * WOFF 1.0 to its sfnt (TrueType/OpenType) form, with Node's zlib: the table data of a WOFF file are
 * the sfnt's tables, each zlib-compressed when that made it smaller (W3C, "WOFF File Format 1.0",
 * sections 3–5). pdfkit reads WOFF itself, but through a pure-JavaScript inflate that costs a few
 * hundred milliseconds per report; decoding once at start-up keeps a report fast.
 */
import { inflateSync } from 'node:zlib';

export class WoffError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'WoffError';
  }
}

const WOFF_SIGNATURE = 0x774f4646; // 'wOFF'

export function woffToSfnt(woff: Buffer): Buffer {
  if (woff.length < 44 || woff.readUInt32BE(0) !== WOFF_SIGNATURE) throw new WoffError('not a WOFF 1.0 file');
  const flavor = woff.readUInt32BE(4);
  const numTables = woff.readUInt16BE(12);
  if (44 + numTables * 20 > woff.length) throw new WoffError('the table directory runs past the end of the file');
  const tables: { tag: number; checksum: number; data: Buffer }[] = [];
  for (let i = 0; i < numTables; i++) {
    const at = 44 + i * 20;
    const tag = woff.readUInt32BE(at);
    const offset = woff.readUInt32BE(at + 4);
    const compLength = woff.readUInt32BE(at + 8);
    const origLength = woff.readUInt32BE(at + 12);
    const checksum = woff.readUInt32BE(at + 16);
    if (offset + compLength > woff.length) throw new WoffError('a table runs past the end of the file');
    const raw = woff.subarray(offset, offset + compLength);
    const data = compLength < origLength ? inflateSync(raw) : Buffer.from(raw);
    if (data.length !== origLength) throw new WoffError('a table does not inflate to its stated length');
    tables.push({ tag, checksum, data });
  }
  let pow = 1;
  let log = 0;
  while (pow * 2 <= numTables) {
    pow *= 2;
    log++;
  }
  const headerSize = 12 + 16 * numTables;
  const size = headerSize + tables.reduce((a, t) => a + ((t.data.length + 3) & ~3), 0);
  const out = Buffer.alloc(size);
  out.writeUInt32BE(flavor, 0);
  out.writeUInt16BE(numTables, 4);
  out.writeUInt16BE(pow * 16, 6);
  out.writeUInt16BE(log, 8);
  out.writeUInt16BE(numTables * 16 - pow * 16, 10);
  let offset = headerSize;
  tables.forEach((t, i) => {
    const rec = 12 + 16 * i;
    out.writeUInt32BE(t.tag, rec);
    out.writeUInt32BE(t.checksum, rec + 4);
    out.writeUInt32BE(offset, rec + 8);
    out.writeUInt32BE(t.data.length, rec + 12);
    t.data.copy(out, offset);
    offset += (t.data.length + 3) & ~3;
  });
  return out;
}
