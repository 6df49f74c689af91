// Filtering, sorting and paging of a results table (done in memory: a quiz has
// hundreds of students at most, and every total is computed anyway).
import type { ResultsQuery } from '#shared/schemas/quiz'
import { CRITERION_LABELS } from '#shared/schemas/quiz'
import type { StudentResult } from '#shared/types/quiz'
import type { ItemColumn } from './results'

export interface ResultsPageQuery extends Required<Pick<ResultsQuery, 'sort' | 'dir' | 'page' | 'pageSize'>> {
  q?: string
  cohortId?: number
  status?: StudentResult['status']
}

export function resultsPage(columns: ItemColumn[], rows: StudentResult[], query: ResultsPageQuery) {
  let list = rows
  if (query.q) {
    const q = query.q.toLowerCase()
    list = list.filter(r => r.name.toLowerCase().includes(q) || r.email.toLowerCase().includes(q))
  }
  if (query.cohortId) list = list.filter(r => r.cohortId === query.cohortId)
  if (query.status) list = list.filter(r => r.status === query.status)

  const itemSort = /^item-(\d+)$/.exec(query.sort)
  const key = (r: StudentResult): string | number => {
    if (itemSort) return r.items[Number(itemSort[1])]?.earned ?? -1
    switch (query.sort) {
      // a student who never started has no total or slips: below any score, even 0
      case 'total': return r.status === 'not-started' ? -1 : r.earned
      case 'slips': return r.status === 'not-started' ? -1 : r.slips
      case 'time': return r.timeTakenMs ?? -1
      case 'status': return r.status
      default: return r.name.toLowerCase()
    }
  }
  const sign = query.dir === 'desc' ? -1 : 1
  list = [...list].sort((a, b) => {
    const x = key(a)
    const y = key(b)
    const c = typeof x === 'number' && typeof y === 'number' ? x - y : String(x).localeCompare(String(y))
    return c * sign || a.name.localeCompare(b.name)
  })
  const total = list.length
  const items = list.slice((query.page - 1) * query.pageSize, query.page * query.pageSize)
  return {
    columns: columns.map(c => ({
      id: c.id,
      position: c.position,
      kind: c.config.kind,
      title: c.config.source.title,
      possible: c.possible,
      criteria: c.criteria.map(k => ({ criterion: k, label: CRITERION_LABELS[k] })),
    })),
    items,
    total,
    page: query.page,
    pageSize: query.pageSize,
    summary: {
      students: rows.length,
      started: rows.filter(r => r.status !== 'not-started').length,
      finished: rows.filter(r => r.status === 'finished').length,
      // only those who finished: a student who never started has no score (not 0), and
      // one still sitting has not handed in yet
      meanScore: meanOfFinished(rows),
    },
  }
}

/** Mean score of the students who finished; null while nobody has. */
export function meanOfFinished(rows: Pick<StudentResult, 'status' | 'score'>[]): number | null {
  const done = rows.filter(r => r.status === 'finished')
  return done.length ? done.reduce((a, r) => a + r.score, 0) / done.length : null
}
