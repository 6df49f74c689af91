// One page of a list that grows (`listPaging`/`pageQuery` in shared/schemas/common.ts):
// how many rows the filtered query has in all, and the rows of the asked-for page.
// Each list route keeps its own filters, columns and order.
import type { SelectQueryBuilder } from 'kysely'

/** The page asked for: 1-based, and how many rows a page holds. */
export interface Paging { page: number, pageSize: number }

/** How many rows the (filtered) query has in all. */
export async function countRows(base: SelectQueryBuilder<any, any, object>): Promise<number> {
  const { total } = await base.select(eb => eb.fn.countAll<number>().as('total')).executeTakeFirstOrThrow()
  return Number(total)
}

/** The rows of one page of a query that is already ordered. */
export function onePage<Q extends SelectQueryBuilder<any, any, any>>(query: Q, { page, pageSize }: Paging): Q {
  return query.limit(pageSize).offset((page - 1) * pageSize) as Q
}
