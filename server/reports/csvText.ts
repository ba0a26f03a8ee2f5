/**
 * CSV text that cannot attack the reader: a text cell that a spreadsheet would run as a formula
 * (its first character =, +, -, @, tab or carriage return) is written with a leading apostrophe
 * (papaparse's escapeFormulae), so it shows as text. Numbers and booleans are written as they
 * are, so a negative number such as -1.25 stays a number. Lines end with CRLF.
 */
import Papa from 'papaparse';

export type CsvCell = string | number | boolean | null;

/** The first character that makes a spreadsheet read a cell as a formula (the whole cell, newlines too). */
const FORMULA_START = /^[=+\-@\t\r]/;

export function toCsv(rows: CsvCell[][]): string {
  return Papa.unparse(
    rows.map((r) => r.map((c) => (c === null ? '' : c))),
    { newline: '\r\n', escapeFormulae: FORMULA_START },
  );
}
