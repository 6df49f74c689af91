// CSV for the review's "Download CSV" buttons. Cells a spreadsheet would run as
// a formula (learner-written records can start with "=" or "@") get a leading
// apostrophe; numbers are left alone.
import Papa from 'papaparse'

export type Cell = string | number | null | undefined

const FORMULA_START = /^[=+\-@\t\r]/

export function csvCell(v: Cell): string | number {
  if (v === null || v === undefined) return ''
  if (typeof v === 'number') return v
  return FORMULA_START.test(v) ? `'${v}` : v
}

export function toCsv(header: string[], rows: Cell[][]): string {
  return Papa.unparse({ fields: header, data: rows.map(r => r.map(csvCell)) }, { newline: '\r\n' })
}
