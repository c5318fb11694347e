/**
 * The one CSV writer and reader (RFC 4180 shape: delimiter ',', CRLF line ends, a field quoted only when
 * it holds a comma, quote or line break, quotes doubled). No delimiter guessing on reading.
 *
 * Spreadsheet safety ("CSV injection", OWASP): a cell that starts with = + - @ or a tab or CR could be
 * run as a formula by a spreadsheet, so the writer puts one apostrophe in front of it; a cell that
 * already starts with apostrophes before such a character gets one more, so the reader's rule (drop one
 * leading apostrophe when apostrophes and then = + - @ tab CR follow) restores exactly what was written.
 * A cell that is a plain number (-0.5, +3e2) is no formula and is left alone.
 */
import Papa from 'papaparse';

const FORMULA_START = /^'*[=+\-@\t\r]/;
const GUARDED = /^'+[=+\-@\t\r]/;
const PLAIN_NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

export type CsvCell = string | number | boolean | null | undefined;

/** The text a spreadsheet shows as text: formula-leading cells get a leading apostrophe. */
export function neutraliseFormula(text: string): string {
  return FORMULA_START.test(text) && !PLAIN_NUMBER.test(text) ? `'${text}` : text;
}

/** The reader's inverse of neutraliseFormula: the cell as the user typed it. */
export function restoreFormulaText(cell: string): string {
  return GUARDED.test(cell) ? cell.slice(1) : cell;
}

const text = (v: CsvCell): string => (v === null || v === undefined ? '' : String(v));

/**
 * CSV lines, each ending in CRLF, exactly as they appear inside a file toCsv writes: a file sent in
 * pieces (the header first, then rows chunk by chunk) is byte for byte the file toCsv would write.
 */
export function toCsvLines(rows: readonly (readonly CsvCell[])[]): string {
  if (rows.length === 0) return '';
  const lines = rows.map((r) => r.map((c) => neutraliseFormula(text(c))));
  const body = Papa.unparse(lines, {
    delimiter: ',',
    newline: '\r\n',
    quotes: false,
    quoteChar: '"',
    escapeChar: '"',
    escapeFormulae: false,
  });
  return `${body}\r\n`;
}

/** A whole CSV file: header line, one line per row, every line ending in CRLF. */
export function toCsv(header: readonly string[], rows: readonly (readonly CsvCell[])[]): string {
  return toCsvLines([header, ...rows]);
}

export interface CsvRecord {
  /** The file line the record starts on (quoted fields may span lines). */
  line: number;
  cells: string[];
}

/** Records of a CSV file (delimiter ','; CRLF, LF or CR line ends; a leading byte-order mark dropped); blank lines dropped. */
export function readCsvRecords(source: string): CsvRecord[] {
  const normalised = source.replace(/^\uFEFF/, '').replace(/\r\n?/g, '\n');
  const records: CsvRecord[] = [];
  let start = 0;
  let line = 1;
  Papa.parse<string[]>(normalised, {
    header: false,
    delimiter: ',',
    newline: '\n',
    quoteChar: '"',
    escapeChar: '"',
    skipEmptyLines: false,
    step: (result) => {
      records.push({ line, cells: result.data.map((c) => String(c ?? '')) });
      line += (normalised.slice(start, result.meta.cursor).match(/\n/g) ?? []).length;
      start = result.meta.cursor;
    },
  });
  return records.filter((r) => r.cells.some((c) => c.trim() !== ''));
}
