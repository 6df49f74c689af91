import { afterEach, describe, expect, it, vi } from 'vitest'
import { nextTick } from 'vue'
import SimPrismTray from '~/components/sim/SimPrismTray.vue'
import SimGazeFace from '~/components/sim/SimGazeFace.vue'
import SimPatientView from '~/components/sim/SimPatientView.vue'
import SimRecordPad from '~/components/sim/SimRecordPad.vue'
import { parseRecord } from '#shared/engine/parser'
import { engineCase } from '~~/tests/support/presentation'
import { fakeLayout, mountInBench } from '~~/tests/support/bench-host'

afterEach(() => {
  vi.restoreAllMocks()
})

describe('the prism tray', () => {
  it('places a prism before the chosen eye and moves that eye\'s streak towards the apex', async () => {
    fakeLayout(640)
    const { presentation } = engineCase('so-palsy-right', 'setting-test-1')
    const { wrapper, store } = await mountInBench(SimPrismTray, { presentation, mode: 'learner-turns', readScale: false })
    const before = store.drawnView!.streaks.RE.offset.y - store.drawnView!.streaks.LE.offset.y
    await wrapper.findAll('label').find(l => l.text() === 'Down')!.find('input').setValue(true)
    await wrapper.get('#prism-power').setValue('8')
    await wrapper.findAll('button').find(b => b.text() === 'Place prism')!.trigger('click')
    expect(store.prisms).toEqual([{ eye: 'RE', power: 8, base: 'down' }])
    // base down before the right eye moves its image up by the prism's power (image moves toward the apex)
    const after = store.drawnView!.streaks.RE.offset.y - store.drawnView!.streaks.LE.offset.y
    expect(after - before).toBeCloseTo(8, 6)
    await nextTick()
    expect(wrapper.get('[aria-label="Prisms in the frame"]').text()).toContain('8Δ base down · RE')
    await wrapper.get('[aria-label="Remove 8 prism dioptres base down before the right eye"]').trigger('click')
    expect(store.prisms).toEqual([])
  })

  it('explains, beside the patient\'s words, why a vertical prism helps when the lines lie on top of each other', async () => {
    fakeLayout(640)
    // a patient with no vertical deviation: the two streaks overlap
    const { presentation } = engineCase('normal', 'setting-test-2')
    expect(Math.abs(presentation.positions.primary.alignment.vertical)).toBeLessThan(2)
    const { wrapper, store } = await mountInBench(SimPatientView, { presentation, mode: 'learner-turns', readScale: false })
    expect(store.drawnView!.overlap).toBe(true)
    const hint = wrapper.get('[data-testid="prism-hint"]')
    expect(hint.text()).toContain('a vertical prism')
    // the advice follows the patient's words directly, inside the patient's view
    expect(hint.element.previousElementSibling?.getAttribute('data-testid')).toBe('patient-words')
    store.addPrism({ eye: 'LE', power: 6, base: 'up' })
    await nextTick()
    expect(store.drawnView!.overlap).toBe(false)
    expect(wrapper.find('[data-testid="prism-hint"]').exists()).toBe(false)
  })

  it('holds four prisms at most', async () => {
    fakeLayout(640)
    const { presentation } = engineCase('so-palsy-right', 'setting-test-1')
    const { wrapper, store } = await mountInBench(SimPrismTray, { presentation, mode: 'learner-turns', readScale: false })
    const place = wrapper.findAll('button').find(b => b.text() === 'Place prism')!
    for (let i = 0; i < 5; i++) await place.trigger('click')
    expect(store.prisms).toHaveLength(4)
    expect(place.attributes('disabled')).toBeDefined()
  })
})

describe('the gaze face', () => {
  it('changes the position of gaze, and with it the patient (per the case)', async () => {
    fakeLayout(640)
    const { presentation } = engineCase('so-palsy-right', 'setting-test-1')
    const { wrapper, store } = await mountInBench(SimGazeFace, { presentation, mode: 'learner-turns', readScale: false })
    const radios = wrapper.findAll('input[type="radio"][name="gaze"]')
    expect(radios).toHaveLength(9)
    // seen from in front, the patient looking to their own right looks towards the viewer's left
    const labels = radios.map(r => r.attributes('aria-label'))
    expect(labels.indexOf('Right gaze')).toBeLessThan(labels.indexOf('Left gaze'))
    const down = presentation.positions.down.horizontalAt!
    store.setRod('RE', down.RE)
    store.setRod('LE', down.LE)
    expect(store.words).not.toMatch(/both look level/)
    await radios.find(r => r.attributes('aria-label') === 'Downgaze')!.setValue(true)
    expect(store.gaze).toBe('down')
    expect(store.words).toMatch(/both look level/)
    expect(wrapper.get('[data-testid="gaze-now"]').text()).toBe('Downgaze')
  })
})

describe('the record pad', () => {
  it('shows how the record is read while it is typed, and what could not be read', async () => {
    fakeLayout(640)
    const { presentation } = engineCase('so-palsy-right', 'setting-test-1')
    const { wrapper } = await mountInBench(SimRecordPad, { presentation, mode: 'learner-turns', readScale: false })
    expect(wrapper.text()).toContain('nothing written yet')
    await wrapper.get('#record-text').setValue('DMR N PP: RE 8 ex, LE nil')
    expect(wrapper.get('[data-testid="read-as"]').text()).toBe('Test: double Maddox rod · Near · Primary · RE 8° excyclo · LE no torsion')
    // an amount with no eye is not guessed: the parser says so and the pad shows it
    const text = 'DMR near primary 10 ex'
    const problems = parseRecord(text).problems
    expect(problems.map(p => p.code)).toContain('amount-without-eye')
    await wrapper.get('#record-text').setValue(text)
    const shown = wrapper.findAll('li').map(li => li.text())
    expect(shown).toEqual(problems.map(p => p.message))
  })
})
