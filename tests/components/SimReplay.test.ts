// A past attempt on the read-only bench: the bench as the learner left it, nothing
// to change or submit, and nothing at all when there is no case to show.
import { afterEach, describe, expect, it, vi } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import SimReplay from '~/components/sim/SimReplay.vue'
import SimBench from '~/components/sim/SimBench.vue'
import type { BenchDraft } from '#shared/bench/contract'
import type { Bench } from '~/composables/useBench'
import { engineCase } from '~~/tests/support/presentation'
import { fakeLayout } from '~~/tests/support/bench-host'

afterEach(() => vi.restoreAllMocks())

const { presentation } = engineCase('so-palsy-right', 'replay-test-1')
const draft: BenchDraft = { gaze: 'down', distance: 'near', readings: { RE: 97, LE: 88 }, prisms: [], lights: 'dim', record: 'DMR near downgaze: RE 7° excyclo, LE 2° excyclo' }

describe('SimReplay', () => {
  it('shows the bench as it was left, locked, with no way to submit or go on', async () => {
    fakeLayout(640)
    const wrapper = await mountSuspended(SimReplay, { props: { benchCase: { presentation, mode: 'learner-turns', readScale: false }, draft } })
    const bench = (wrapper.findComponent(SimBench).vm as unknown as { bench: Bench }).bench
    expect(bench.locked).toBe(true)
    expect(bench.gaze).toBe('down')
    expect(bench.rods).toEqual({ RE: 97, LE: 88 })
    expect((wrapper.get('#record-text').element as HTMLTextAreaElement).value).toBe(draft.record)
    expect(wrapper.get('#record-text').attributes('readonly')).toBeDefined()
    expect(wrapper.findAll('button').some(b => b.text() === 'Submit record')).toBe(false)
    expect(wrapper.text()).toContain('Interpretation: which muscle?')
    bench.setRod('RE', 120)
    expect(bench.rods.RE).toBe(97)
  })

  it('leaves the interpretation out when asked, and shows nothing without a presentation', async () => {
    fakeLayout(640)
    expect(presentation.coverTest).toBeDefined()
    const without = await mountSuspended(SimReplay, { props: { benchCase: { presentation, mode: 'learner-turns', readScale: false }, draft, interpretation: false } })
    expect(without.text()).not.toContain('Interpretation: which muscle?')
    const none = await mountSuspended(SimReplay, { props: { benchCase: { presentation: null, mode: 'learner-turns', readScale: false }, draft } })
    expect(none.find('[data-testid="bench"]').exists()).toBe(false)
  })
})
