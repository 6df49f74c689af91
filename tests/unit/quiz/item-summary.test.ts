import { describe, expect, it } from 'vitest'
import { itemSummary } from '#shared/quiz/item-summary'
import type { StaffQuizItem } from '#shared/types/quiz'

type Summarised = Parameters<typeof itemSummary>[0]
const engine = { type: 'engine', templateId: 'so-palsy-right', title: 'Right superior oblique palsy' } as const
const base: Summarised = { kind: 'dmr', source: engine, perStudent: true, mode: 'patient-turns', readScale: false, tolerance: 2 }

describe('quiz item summaries', () => {
  it('describe items that behave the same in the same words', () => {
    // patient turns always hide the figure, so "read the scale" changes nothing there
    expect(itemSummary({ ...base, readScale: true })).toBe(itemSummary(base))
    expect(itemSummary(base)).toBe('Cyclodial template · patient turns · a patient per student · tolerance 2°')
    // an exact case is one patient for everyone whatever the per-student flag says
    const exact: StaffQuizItem['source'] = { type: 'case', id: 4, title: 'Case four' }
    expect(itemSummary({ ...base, source: exact, perStudent: true })).toBe(itemSummary({ ...base, source: exact, perStudent: false }))
  })

  it('name the settings that do change the item', () => {
    const learner = { ...base, mode: 'learner-turns' as const }
    expect(itemSummary({ ...learner, readScale: true })).toBe('Cyclodial template · learner turns · read the scale · a patient per student · tolerance 2°')
    expect(itemSummary({ ...learner, readScale: true })).not.toBe(itemSummary(learner))
    expect(itemSummary({ ...base, perStudent: false })).toContain('one patient for all')
  })

  it('fundus items: photographs are one picture for all', () => {
    const photo: StaffQuizItem['source'] = { type: 'photo', id: 2, title: 'Disc study', eye: 'LE', angle: 7.25 }
    expect(itemSummary({ kind: 'fundus', source: photo, perStudent: true, mode: null, readScale: false, tolerance: 1.5 }))
      .toBe('Your fundus photograph · left eye · reference 7.3° · one picture for all · angle tolerance 1.5°')
    expect(itemSummary({ kind: 'fundus', source: engine, perStudent: true, mode: null, readScale: false, tolerance: 1 })).toContain('both eyes')
  })
})
