// FundusResult: the grader's notes under the marks, and the tutor's notes on the
// photograph in their own section only when the tutor wrote some.
import { describe, expect, it } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import FundusResult from '~/components/fundus/FundusResult.vue'
import { gradeFundus } from '~~/server/lib/fundus/grade'

// fovea 2.5 disc diameters temporal of the disc and 0.3 below it: atan2(0.3, 2.5) ≈ 6.8°,
// inside both eyes' normal ranges (shared/engine/fundus/normals.ts)
const references = {
  RE: { eye: 'RE' as const, disc: { x: 0, y: 0 }, fovea: { x: -2.5, y: 0.3 }, ddUnit: 1 },
  LE: { eye: 'LE' as const, disc: { x: 0, y: 0 }, fovea: { x: 2.5, y: 0.3 }, ddUnit: 1 },
}
// the learner puts the right eye's disc mark one disc diameter off the disc: the grader writes a placement note
const graded = gradeFundus({ references, marks: { RE: { ...references.RE, disc: { x: 1, y: 0 }, finding: 'within-normal' }, LE: { ...references.LE, finding: 'within-normal' } } })

describe('FundusResult', () => {
  it('shows the tutor\'s notes as written when there are some', async () => {
    const wrapper = await mountSuspended(FundusResult, { props: { result: graded, notes: 'Look again at the disc edge.' } })
    const section = wrapper.get('[data-testid="fundus-tutor-notes"]')
    expect(section.text()).toContain('Tutor\'s notes')
    expect(section.text()).toContain('Look again at the disc edge.')
  })

  it('has no tutor\'s-notes section without notes, and never prints a raw list', async () => {
    const wrapper = await mountSuspended(FundusResult, { props: { result: graded } })
    expect(wrapper.find('[data-testid="fundus-tutor-notes"]').exists()).toBe(false)
    expect(wrapper.text()).not.toContain('Tutor\'s notes')
    expect(wrapper.text()).not.toMatch(/\[\s*\]|\["/)
  })

  it('lists the grader\'s own notes for each eye under the marks', async () => {
    const gradeNotes = (['RE', 'LE'] as const).flatMap(e => graded.eyes[e]!.notes)
    expect(gradeNotes.length).toBeGreaterThan(0)
    const wrapper = await mountSuspended(FundusResult, { props: { result: graded } })
    for (const note of gradeNotes) expect(wrapper.text()).toContain(note)
  })
})
