/**
 * CSV text per RFC 4180: fields separated by commas, records by CRLF, a field holding a comma, a
 * double quote, CR or LF is enclosed in double quotes with inner quotes doubled. The header row is the
 * first record. Free text that a spreadsheet would take for a formula (a leading =, +, -, @, tab or CR)
 * gets a leading apostrophe, so opening the file never runs anything (common practice); numbers are
 * written as numbers and are left alone.
 */

export type CsvCell = string | number | null | undefined;

/** A cell as free text (ids, labels): guarded against formula injection. */
export interface CsvText {
  text: string;
}

export const csvText = (text: string): CsvText => ({ text });

const NEEDS_QUOTES = /[",\r\n]/;
const FORMULA_START = /^[=+\-@\t\r]/;

function plainCell(v: CsvCell): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
  return v;
}

/** One field, quoted when it must be. */
export function csvField(v: CsvCell | CsvText): string {
  let s: string;
  if (v !== null && typeof v === 'object') s = FORMULA_START.test(v.text) ? `'${v.text}` : v.text;
  else s = plainCell(v);
  return NEEDS_QUOTES.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

export function csvRecord(cells: readonly (CsvCell | CsvText)[]): string {
  return cells.map(csvField).join(',');
}

/** A whole file: the header and the rows, every record (the last too) ended by CRLF. */
export function csvDocument(header: readonly string[], rows: readonly (readonly (CsvCell | CsvText)[])[]): string {
  for (const [i, r] of rows.entries())
    if (r.length !== header.length) throw new RangeError(`csvDocument: row ${i} has ${r.length} fields, the header ${header.length}`);
  return [header.map((h) => csvField(h)), ...rows.map(csvRecord)].map((r) => `${r}\r\n`).join('');
}
