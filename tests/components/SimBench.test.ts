import { afterEach, describe, expect, it, vi } from 'vitest'
import { nextTick } from 'vue'
import type { VueWrapper } from '@vue/test-utils'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import SimBench from '~/components/sim/SimBench.vue'
import SimPatientView from '~/components/sim/SimPatientView.vue'
import type { Bench } from '~/composables/useBench'
import { gradeAttempt } from '~~/server/lib/engine/attempt'
import { patientSetsRods } from '~~/server/lib/engine/patient'
import { SLIP_INFO } from '#shared/engine/slips'
import type { AttemptBody, BenchDraft, BenchResult, TurnRequest } from '#shared/bench/contract'
import { engineCase } from '~~/tests/support/presentation'
import { fakeLayout, nextFrame } from '~~/tests/support/bench-host'

afterEach(() => {
  vi.restoreAllMocks()
  vi.useRealTimers()
})

/** The state the mounted <SimBench> made for itself with createBench(). */
const benchOf = (wrapper: VueWrapper) => (wrapper.vm as unknown as { bench: Bench }).bench

describe('SimBench in learner-turns', () => {
  const { case: c, presentation } = engineCase('so-palsy-right', 'bench-test-case-7')
  const level = presentation.positions.primary.horizontalAt!

  it('answers live: the patient reports parallel once both rods sit where their lines look level', async () => {
    fakeLayout(640)
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns' } })
    const store = benchOf(wrapper)
    const words = () => wrapper.get('[data-testid="patient-words"]').text()
    expect(words()).not.toMatch(/parallel now/)
    store.setRod('RE', level.RE)
    store.setRod('LE', level.LE)
    await nextTick()
    expect(words()).toMatch(/both look level — parallel now/)
    // the drawn streaks are level too
    const view = wrapper.findComponent(SimPatientView).vm as unknown as { drawModel: { view: { streaks: { RE: { angle: number }, LE: { angle: number } } } } }
    expect(Math.abs(view.drawModel.view.streaks.RE.angle)).toBeLessThan(0.1)
    expect(Math.abs(view.drawModel.view.streaks.LE.angle)).toBeLessThan(0.1)
  })

  it('puts the view into words for screen readers and announces it only once a dial has settled', async () => {
    fakeLayout(640)
    vi.useFakeTimers()
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns' } })
    const store = benchOf(wrapper)
    const live = () => wrapper.get('[data-testid="patient-view-words"]')
    expect(live().attributes('aria-live')).toBe('polite')
    // the canvas is described by the same words
    expect(wrapper.get('canvas[aria-label="What the patient sees"]').attributes('aria-describedby')).toBe(live().attributes('id'))
    await vi.advanceTimersByTimeAsync(800)
    const before = live().text()
    expect(before).toMatch(/line \(right eye\)/)
    // a dial turned degree by degree: nothing new is announced while it moves
    for (let k = 1; k <= 5; k++) {
      store.setRod('RE', level.RE + k)
      await nextTick()
      await vi.advanceTimersByTimeAsync(100)
      expect(live().text()).toBe(before)
    }
    store.setRod('RE', level.RE)
    store.setRod('LE', level.LE)
    await nextTick()
    await vi.advanceTimersByTimeAsync(800)
    // settled: the tilt and the patient's words, together
    expect(live().text()).toMatch(/is level; .* is level\. The two lines are parallel\. The patient says: “.*parallel now\.”$/)
    // the visible words are not a live region of their own (no double announcement)
    expect(wrapper.get('[data-testid="patient-words"]').attributes('aria-live')).toBeUndefined()
    vi.useRealTimers()
  })

  it('autosaves the draft after a pause, and submits the dial settings with the record', async () => {
    fakeLayout(640)
    vi.useFakeTimers()
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns', autosaveMs: 500 } })
    const store = benchOf(wrapper)
    store.setRod('RE', 97)
    store.setGaze('down')
    await nextTick()
    expect(wrapper.emitted('change')).toBeUndefined()
    await vi.advanceTimersByTimeAsync(600)
    const saved = wrapper.emitted('change')!.at(-1)![0] as BenchDraft
    expect(saved).toMatchObject({ gaze: 'down', distance: 'near', readings: { RE: 97, LE: 90 }, prisms: [], lights: 'dim' })
    vi.useRealTimers()

    const submit = wrapper.findAll('button').find(b => b.text() === 'Submit record')!
    expect(submit.attributes('disabled')).toBeDefined()
    await wrapper.get('#record-text').setValue('DMR, near, downgaze: RE 7° excyclotorsion, LE no torsion')
    expect(wrapper.get('[data-testid="read-as"]').text()).toBe('Test: double Maddox rod · Near · Downgaze · RE 7° excyclo · LE no torsion')
    expect(submit.attributes('disabled')).toBeUndefined()
    await submit.trigger('click')
    const body = wrapper.emitted('submit')![0]![0] as AttemptBody
    expect(body).toMatchObject({ gaze: 'down', readings: { RE: 97, LE: 90 }, record: 'DMR, near, downgaze: RE 7° excyclotorsion, LE no torsion' })
    expect(body.trial).toBeUndefined()
  })

  it('sends a change still waiting when the bench goes away, with its own case key', async () => {
    fakeLayout(640)
    const onChange = vi.fn()
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns', autosaveMs: 60_000, caseKey: 41, onChange } })
    benchOf(wrapper).setRod('LE', 85)
    await nextTick()
    expect(onChange).not.toHaveBeenCalled()
    wrapper.unmount()
    expect(onChange).toHaveBeenCalledTimes(1)
    const [draft, key] = onChange.mock.calls[0]! as [BenchDraft, number]
    expect(draft.readings).toEqual({ RE: 90, LE: 85 })
    expect(key).toBe(41)
  })

  it('shows the marks and slips the engine gives, and locks the bench', async () => {
    fakeLayout(640)
    const body = { gaze: 'primary' as const, distance: 'near' as const, readings: { RE: level.RE, LE: level.LE }, prisms: [], lights: 'dim' as const, record: 'right eye 100' }
    const graded = gradeAttempt(c, body, { mode: 'learner-turns' })
    const result: BenchResult = { attemptId: 1, ...graded, truth: { ...graded.truth } }
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns', initialDraft: body, result } })
    const text = wrapper.get('[data-testid="feedback"]').text()
    expect(text).toContain(`${Math.round(graded.score * 100)}%`)
    expect(graded.slips.length).toBeGreaterThan(0)
    for (const s of graded.slips) expect(text).toContain(SLIP_INFO[s.code].title)
    expect(wrapper.get('[data-testid="model-record"]').text()).toBe(graded.modelRecord)
    expect(wrapper.find('[data-testid="eye-image-sketch"]').exists()).toBe(true)
    const store = benchOf(wrapper)
    expect(store.locked).toBe(true)
    store.setRod('RE', 120)
    expect(store.rods.RE).toBe(Math.round(level.RE * 10) / 10)
  })

  it('holds feedback back when asked (quiz use)', async () => {
    fakeLayout(640)
    const body = { gaze: 'primary' as const, distance: 'near' as const, readings: { RE: 90, LE: 90 }, prisms: [], lights: 'dim' as const, record: 'DMR' }
    const graded = gradeAttempt(c, body, { mode: 'learner-turns' })
    const wrapper = await mountSuspended(SimBench, {
      props: { presentation, mode: 'learner-turns', result: { attemptId: 2, ...graded }, showFeedback: false },
    })
    expect(wrapper.find('[data-testid="feedback"]').exists()).toBe(false)
    expect(wrapper.text()).toContain('Your record has been taken')
    expect(wrapper.text()).not.toContain(graded.modelRecord)
  })

  it('offers the interpretation step when the case has cover-test findings', async () => {
    fakeLayout(640)
    expect(presentation.coverTest).toBeDefined()
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns' } })
    expect(wrapper.text()).toContain('Interpretation: which muscle?')
    await wrapper.get('#interp-muscle').setValue('RSO')
    await wrapper.get('#record-text').setValue('DMR near primary RE 5 ex LE nil')
    await wrapper.findAll('button').find(b => b.text() === 'Submit record')!.trigger('click')
    const body = wrapper.emitted('submit')![0]![0] as AttemptBody
    expect(body.interpretation).toEqual({ muscle: 'RSO' })
  })

  it('where the interpretation counts, submitting it incomplete asks once; practice sends at once', async () => {
    fakeLayout(640)
    const quiz = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns', interpretationCounts: true } })
    await quiz.get('#record-text').setValue('DMR near primary RE 5 ex LE nil')
    const dialog = () => quiz.findAll('dialog').find(d => d.text().includes('The interpretation counts in this quiz; submit without it?'))!
    expect(dialog().attributes('open')).toBeUndefined()
    await quiz.findAll('button').find(b => b.text() === 'Submit record')!.trigger('click')
    await nextTick()
    expect(quiz.emitted('submit')).toBeUndefined()
    expect(dialog().attributes('open')).toBeDefined()
    await quiz.findAll('button').find(b => b.text() === 'Submit without it')!.trigger('click')
    expect(quiz.emitted('submit')).toHaveLength(1)
    // answered in full: no question
    const full = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns', interpretationCounts: true } })
    await full.get('#record-text').setValue('DMR near primary RE 5 ex LE nil')
    await full.get('#interp-muscle').setValue('not-applicable')
    await full.findAll('button').find(b => b.text() === 'Submit record')!.trigger('click')
    expect(full.emitted('submit')).toHaveLength(1)
  })

  it('says which marking its dial uses, and leaves the simulation caution to the page (said once, in the footer)', async () => {
    fakeLayout(640)
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns' } })
    expect(wrapper.text()).toContain('Cyclodial\'s dial marks the rod (cylinder) axis: 90° means no torsion')
    expect(wrapper.find('[role="note"][aria-label="Educational simulation"]').exists()).toBe(false)
  })

  it('shows How to read the dials beside the frame until it is closed, and keeps it closed', async () => {
    fakeLayout(640)
    localStorage.removeItem('cyclodial:dial-help-closed')
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns' } })
    const help = wrapper.get('[data-testid="dial-help"]')
    // the reading rule (clinical-facts.md: RE torsion = reading − 90, LE torsion = 90 − reading, + = excyclo)
    expect(help.text()).toContain('Right eye: torsion = reading − 90.')
    expect(help.text()).toContain('Left eye: torsion = 90 − reading.')
    expect(help.text()).toContain('Record the eye, not the image.')
    await help.get('button').trigger('click')
    expect(wrapper.find('[data-testid="dial-help"]').exists()).toBe(false)
    expect(localStorage.getItem('cyclodial:dial-help-closed')).toBe('true')
    wrapper.unmount()
    const again = await mountSuspended(SimBench, { props: { presentation, mode: 'learner-turns' } })
    await nextTick()
    expect(again.find('[data-testid="dial-help"]').exists()).toBe(false)
    await again.get('[data-testid="dial-help-open"]').trigger('click')
    expect(again.find('[data-testid="dial-help"]').exists()).toBe(true)
    localStorage.removeItem('cyclodial:dial-help-closed')
  })
})

describe('SimBench in patient-turns', () => {
  const { case: c, presentation } = engineCase('so-palsy-right', 'bench-test-case-8', 'patient-turns')

  it('holds no dial cues, asks the patient, shows where they left the rods and sends the trial with the readings', async () => {
    expect(presentation.positions.primary.horizontalAt).toBeUndefined()
    fakeLayout(640)
    let trial = 0
    const askPatient = vi.fn(async (req: TurnRequest) => patientSetsRods(c, { ...req, trial: ++trial }))
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'patient-turns', askPatient } })
    const store = benchOf(wrapper)
    expect(wrapper.findAll('[role="slider"]')).toHaveLength(0)
    expect(store.submitBlocker).toBe('Ask the patient to set the rods first.')

    await wrapper.findAll('button').find(b => b.text() === 'Ask the patient to set the rods')!.trigger('click')
    await vi.waitFor(() => expect(store.activeTurn).not.toBeNull())
    expect(askPatient).toHaveBeenCalledWith({ gaze: 'primary', distance: 'near', prisms: [], lights: 'dim' })
    const turn = patientSetsRods(c, { gaze: 'primary', distance: 'near', trial: 1 })
    expect(store.rods).toEqual(turn.readings)
    expect(wrapper.get('[data-testid="patient-words"]').text()).toContain(turn.words.text)
    expect(wrapper.emitted('turn')![0]![0]).toEqual(turn)
    await nextFrame()

    await wrapper.get('#typed-RE').setValue('96')
    await wrapper.get('#typed-LE').setValue('90.5')
    await wrapper.get('#record-text').setValue('DMR near primary: RE 6 ex, LE nil')
    await wrapper.findAll('button').find(b => b.text() === 'Submit record')!.trigger('click')
    const body = wrapper.emitted('submit')![0]![0] as AttemptBody
    expect(body).toMatchObject({ readings: { RE: 96, LE: 90.5 }, trial: 1, gaze: 'primary' })
  })

  it('puts the rods back to 90° when the setting changes after a trial', async () => {
    fakeLayout(640)
    const askPatient = async (req: TurnRequest) => patientSetsRods(c, { ...req, trial: 1 })
    const wrapper = await mountSuspended(SimBench, { props: { presentation, mode: 'patient-turns', askPatient } })
    const store = benchOf(wrapper)
    await wrapper.findAll('button').find(b => b.text() === 'Ask the patient to set the rods')!.trigger('click')
    await vi.waitFor(() => expect(store.activeTurn).not.toBeNull())
    store.addPrism({ eye: 'RE', power: 6, base: 'down' })
    expect(store.activeTurn).toBeNull()
    expect(store.rods).toEqual({ RE: 90, LE: 90 })
    await nextTick()
    expect(wrapper.text()).toContain('The setting changed since the last trial')
  })
})
