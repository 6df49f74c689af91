// The case templates as the practice page lists them: base ids (no difficulty)
// with a title that names the condition. Only for a learner who chose to see them.
import type { Difficulty } from '#shared/engine/types'
import type { PracticeTemplateItem } from '#shared/types/practice'
import { CASE_TEMPLATES, getCaseTemplate } from '~~/server/lib/engine/templates'
import type { CaseTemplate } from '~~/server/lib/engine/templates'

const DIFFICULTY_SUFFIX = /-(standard|challenging)$/

/** `so-palsy-right-challenging` → `so-palsy-right`. */
export const baseTemplateId = (id: string): string => id.replace(DIFFICULTY_SUFFIX, '')

/** The label without its difficulty detail: "Skew deviation — with … (standard)" → "Skew deviation". */
export const baseTemplateTitle = (t: CaseTemplate): string =>
  t.label.replace(/\s*\((standard|challenging)\)$/, '').replace(/\s+—\s.*$/, '')

export function practiceTemplateList(): PracticeTemplateItem[] {
  const seen = new Map<string, PracticeTemplateItem>()
  for (const t of CASE_TEMPLATES) {
    const id = baseTemplateId(t.id)
    const item = seen.get(id) ?? { id, title: baseTemplateTitle(t), difficulties: [] as Difficulty[] }
    item.difficulties.push(t.difficulty)
    seen.set(id, item)
  }
  return [...seen.values()]
}

/**
 * The full template id for a base or full id and a difficulty, or null when there
 * is no such template. A full id that names a different difficulty is refused.
 */
export function resolveTemplateId(id: string, difficulty: Difficulty | undefined): string | null {
  const named = id.match(DIFFICULTY_SUFFIX)?.[1] as Difficulty | undefined
  if (named && difficulty && named !== difficulty) return null
  const full = `${baseTemplateId(id)}-${difficulty ?? named ?? 'standard'}`
  return getCaseTemplate(full)?.id === full ? full : null
}
