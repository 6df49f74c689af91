// The one CSV writer for every export (quiz results, slip patterns, and any later
// one): RFC 4180 text through papaparse's unparse, CRLF lines, and every text cell
// neutralised so a spreadsheet opening the file never runs it as a formula.
import Papa from 'papaparse'

export type CsvCell = string | number | boolean | null | undefined

/**
 * A line is dangerous when it starts with = + - @, a tab or a carriage return
 * (OWASP "CSV Injection"), also after leading white space (spreadsheets trim it),
 * and the full-width = + - @ that some spreadsheets read as the same (from memory).
 */
const FORMULA_LINE = /^(?:[\t\r]|[\s\u00A0\uFEFF]*[=+\-@\uFF1D\uFF0B\uFF0D\uFF20])/

/**
 * Text cells that could run as a formula get a leading apostrophe — on the cell,
 * and on every line inside it that starts like a formula (a line break after a
 * formula, or a formula after a line break). Numbers stay numbers.
 */
export function neutraliseCell(value: CsvCell): string | number {
  if (value === null || value === undefined) return ''
  if (typeof value === 'number') return Number.isFinite(value) ? value : ''
  if (typeof value === 'boolean') return value ? 'true' : 'false'
  return value
    .split(/(\r\n|\r|\n)/)
    .map((part, i) => (i % 2 === 0 && FORMULA_LINE.test(part) ? `'${part}` : part))
    .join('')
    // a cell that is one carriage return or tab has nothing after it to split on
    .replace(/^[\t\r]/, m => `'${m}`)
}

export interface CsvOptions {
  /** Start with a UTF-8 byte-order mark so spreadsheets read accented names correctly. */
  bom?: boolean
}

export function writeCsv(header: CsvCell[], rows: CsvCell[][], options: CsvOptions = {}): string {
  const text = Papa.unparse({ fields: header.map(h => String(neutraliseCell(h))), data: rows.map(r => r.map(neutraliseCell)) }, { newline: '\r\n' })
  return `${options.bom ? '\uFEFF' : ''}${text}\r\n`
}
