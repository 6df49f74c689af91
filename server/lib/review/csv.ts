// CSV for the review's "Download CSV" buttons, through the one CSV writer
// (server/utils/csv.ts), which defuses cells a spreadsheet would run as a formula.
import { writeCsv } from '~~/server/utils/csv'
import type { CsvCell } from '~~/server/utils/csv'

export type Cell = CsvCell

export function toCsv(header: string[], rows: Cell[][]): string {
  return writeCsv(header, rows)
}
