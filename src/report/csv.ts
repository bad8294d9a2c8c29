/**
 * CSV writing (RFC 4180 quoting) with formula-injection neutralisation.
 *
 * OWASP "CSV Injection" guidance (owasp.org/www-community/attacks/CSV_Injection): a cell that begins
 * with `=`, `+`, `-`, `@`, tab (0x09) or carriage return (0x0D) may be run as a formula by spreadsheet
 * software; prefix such text cells with a single quote and quote the cell. Numbers stay numbers:
 * number values are written as they are (negative ones included), and a text that is exactly a plain
 * decimal number (`-3.5`, `1e-12`) is left alone because a spreadsheet reads it as a number, not a formula.
 */

const PLAIN_NUMBER = /^-?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/;
const DANGEROUS_START = /^[=+\-@\t\r]/;

export type CsvValue = string | number | boolean | null | undefined;

/** One CSV cell. */
export function csvCell(v: CsvValue): string {
  if (v === null || v === undefined) return '';
  if (typeof v === 'number') return Number.isFinite(v) ? String(v) : '';
  if (typeof v === 'boolean') return v ? 'true' : 'false';
  let s = v;
  if (DANGEROUS_START.test(s) && !PLAIN_NUMBER.test(s)) s = `'${s}`;
  return /[",\r\n]/.test(s) || s !== s.trim() || s.startsWith("'") ? `"${s.replace(/"/g, '""')}"` : s;
}

/** A whole CSV document (CRLF line ends as in RFC 4180). */
export function toCsv(header: readonly string[], rows: readonly (readonly CsvValue[])[]): string {
  return [header, ...rows].map((r) => r.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
