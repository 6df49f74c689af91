// The casebook as GET /api/casebook answers it (engine templates with their published
// ranges, the tutor's narrowed templates and exact cases, default tolerance and weights).
import type { CaseSpec } from '#shared/engine/case-spec'
import type { Presentation } from '#shared/engine/presentation'
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

/** POST /api/casebook/preview — a case as a student receives it, and for staff the finding it is marked against. */
export interface CasePreview { title: string, seed: string, mode: string, presentation: Presentation, truth: { label: string, torsion: { RE: number, LE: number }, objectiveTorsion: { RE: number, LE: number }, levelAt: { RE: number, LE: number }, modelRecord: string, palsiedMuscles: string[], sources: string[] }, tolerance: number }
