// Results as CSV (RFC 4180: CRLF lines, quoted where needed), one row per
// student, a column per item and per criterion, then totals. A UTF-8 byte-order
// mark makes spreadsheets read accented names correctly. Written by the one CSV
// writer (server/utils/csv.ts), so no cell runs as a formula when opened.
import { writeCsv } from '~~/server/utils/csv'
import { CRITERION_LABELS } from '#shared/schemas/quiz'
import type { StudentResult } from '#shared/types/quiz'
import type { ItemColumn } from './results'

const round2 = (v: number) => Math.round(v * 100) / 100
const STATUS_WORDS = { 'not-started': 'not started', 'in-progress': 'in progress', 'finished': 'finished' } as const

export function resultsCsv(columns: ItemColumn[], rows: StudentResult[]): string {
  const header = ['Student', 'E-mail', 'Cohort', 'Status', 'Started (UTC)', 'Finished (UTC)', 'Time taken (min)']
  for (const c of columns) {
    header.push(`Item ${c.position} total`)
    for (const k of c.criteria) header.push(`Item ${c.position} ${CRITERION_LABELS[k].toLowerCase()}`)
  }
  header.push('Slips', 'Total points', 'Points possible', 'Total %')

  const data = rows.map((r) => {
    const line: (string | number)[] = [
      r.name,
      r.email,
      r.cohortName,
      STATUS_WORDS[r.status],
      r.startedAt ?? '',
      r.finishedAt ?? '',
      r.timeTakenMs === null ? '' : round2(r.timeTakenMs / 60_000),
    ]
    for (const c of columns) {
      const cell = r.items[c.id]
      line.push(cell?.earned === null || cell?.earned === undefined ? '' : round2(cell.earned))
      for (const k of c.criteria) {
        const m = cell?.marks.find(x => x.criterion === k)
        line.push(m ? round2(m.score * m.weight) : '')
      }
    }
    // a student who never started has no score: empty cells, never 0 (the Status column says why)
    if (r.status === 'not-started') line.push('', '', round2(r.possible), '')
    else line.push(r.slips, round2(r.earned), round2(r.possible), round2(r.score * 100))
    return line
  })
  return writeCsv(header, data, { bom: true })
}
