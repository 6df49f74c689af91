// One line that describes a quiz item to staff. It names only settings that change
// what the student meets, so two items that behave the same read the same: "read the
// scale" only where the student turns the rods (patient turns always hide the
// figure), and an exact case or a photograph is one patient for everyone whatever
// the per-student flag says.
import type { StaffQuizItem } from '#shared/types/quiz'

const SOURCE_WORDS = { engine: 'Cyclodial template', template: 'Your template', case: 'Exact case', photo: 'Your fundus photograph' } as const

export function itemSummary(item: Pick<StaffQuizItem, 'kind' | 'source' | 'perStudent' | 'mode' | 'readScale' | 'tolerance'>): string {
  const parts: string[] = [SOURCE_WORDS[item.source.type]]
  const onePatient = item.source.type === 'case' || item.source.type === 'photo'
  if (item.kind === 'fundus') {
    if (item.source.type === 'photo') parts.push(`${item.source.eye === 'RE' ? 'right eye' : 'left eye'}`, `reference ${item.source.angle.toFixed(1)}°`)
    else parts.push('both eyes')
    parts.push(onePatient || !item.perStudent ? 'one picture for all' : 'a patient per student', `angle tolerance ${item.tolerance}°`)
    return parts.join(' · ')
  }
  const learnerTurns = item.mode === 'learner-turns'
  parts.push(learnerTurns ? 'learner turns' : 'patient turns')
  if (learnerTurns && item.readScale) parts.push('read the scale')
  parts.push(onePatient || !item.perStudent ? 'one patient for all' : 'a patient per student', `tolerance ${item.tolerance}°`)
  return parts.join(' · ')
}
