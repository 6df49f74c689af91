// The slip-patterns filters live in the page's query string, so a view can be
// bookmarked, the drill-down can carry it, and Back returns to it.
import type { LocationQuery } from 'vue-router'

export const REVIEW_FILTER_KEYS = ['cohortId', 'kind', 'quizId', 'from', 'to', 'template', 'condition', 'eye'] as const
export type ReviewFilterKey = (typeof REVIEW_FILTER_KEYS)[number]
export type ReviewFilterState = Partial<Record<ReviewFilterKey, string>>

export function pickFilters(query: LocationQuery, keys: readonly string[] = REVIEW_FILTER_KEYS): Record<string, string> {
  const out: Record<string, string> = {}
  for (const k of keys) {
    const v = query[k]
    const s = Array.isArray(v) ? v[0] : v
    if (typeof s === 'string' && s !== '') out[k] = s
  }
  return out
}

export function useReviewFilters() {
  const route = useRoute()
  const router = useRouter()
  const filters = computed<ReviewFilterState>(() => pickFilters(route.query))
  function set(patch: ReviewFilterState) {
    const next = { ...filters.value, ...patch }
    for (const k of Object.keys(next) as ReviewFilterKey[]) if (!next[k]) delete next[k]
    return router.replace({ query: next })
  }
  /** A query string for links (drill-down, CSV) that keeps the current filters. */
  function withFilters(extra: Record<string, string | number | undefined> = {}): Record<string, string> {
    const q: Record<string, string> = { ...filters.value } as Record<string, string>
    for (const [k, v] of Object.entries(extra)) if (v !== undefined && v !== '') q[k] = String(v)
    return q
  }
  return { filters, set, withFilters }
}

export function csvHref(table: string, query: Record<string, string>): string {
  return `/api/review/export.csv?${new URLSearchParams({ ...query, table }).toString()}`
}
