// The casebook as the staff pages load it (engine templates, the tutor's own
// templates and exact cases, default tolerance and weights).
import type { CaseSpec } from '#shared/engine/caseSpec'
import type { NarrowedRanges } from '#shared/schemas/casebook'
import type { QuizCriterion } from '#shared/schemas/quiz'

export interface EngineTemplateView {
  id: string
  label: string
  condition: string
  difficulty: 'standard' | 'challenging'
  side: 'RE' | 'LE' | null
  sideFromSeed: boolean
  torsion: { range: [number, number], of: string }
  vertical: [number, number]
  sources: string[]
}
export interface CasebookTemplateView { id: number, title: string, templateId: string, templateLabel: string, ranges: NarrowedRanges, tolerance: number, notes: string | null, archived: boolean, ownerName: string | null }
export interface CasebookCaseView { id: number, title: string, spec: CaseSpec, tolerance: number, archived: boolean, ownerName: string | null }
export interface CasebookData {
  engine: EngineTemplateView[]
  templates: CasebookTemplateView[]
  cases: CasebookCaseView[]
  defaults: { tolerance: number, weights: Record<QuizCriterion, number> }
  /** Paging: the same page of templates and of exact cases, each with its total. */
  page: number
  pageSize: number
  templatesTotal: number
  casesTotal: number
}

export function useCasebook(archived: Ref<'0' | '1'> = ref('0'), page: Ref<number> = ref(1)) {
  return useFetch<CasebookData>('/api/casebook', { key: 'casebook', query: { archived, page } })
}

/** What a template's torsion range measures, in words. */
export const TORSION_OF_WORDS: Record<string, string> = {
  'each-eye': 'each eye',
  'affected-eye': 'the affected eye',
  'total': 'both eyes together',
  'objective-affected-eye': 'the affected eye (objective)',
  'hyper-and-hypo-eye': 'each eye (size)',
}
