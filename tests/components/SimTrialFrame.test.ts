import { afterEach, describe, expect, it, vi } from 'vitest'
import { nextTick } from 'vue'
import SimTrialFrame from '~/components/sim/SimTrialFrame.vue'
import { frameLayout, polar } from '~/utils/sim/frame-geometry'
import { engineCase } from '~~/tests/support/presentation'
import { fakeLayout, mountInBench, nextFrame } from '~~/tests/support/bench-host'

const { presentation } = engineCase('so-palsy-right', 'frame-test-1')
const learner = { presentation, mode: 'learner-turns' as const, readScale: false }

afterEach(() => {
  vi.restoreAllMocks()
})

describe('SimTrialFrame', () => {
  it('draws each rod where the store says, and follows it when the store changes', async () => {
    const rec = fakeLayout(640)
    const { wrapper, store } = await mountInBench(SimTrialFrame, learner)
    const frame = wrapper.findComponent(SimTrialFrame)
    const model = () => (frame.vm as unknown as { drawModel: { readings: { RE: number, LE: number } } }).drawModel
    expect(model().readings).toEqual({ RE: 90, LE: 90 })

    store.setRod('RE', 103.5)
    store.setRod('LE', 84)
    await nextTick()
    expect(model().readings).toEqual({ RE: 103.5, LE: 84 })

    rec.clear()
    await nextFrame()
    const layout = frameLayout(640)
    const tips = rec.lineTos()
    const hit = (eye: 'RE' | 'LE', reading: number) => {
      const c = layout.cells[eye]
      const tip = polar(c, reading, c.radius * 1.1)
      return tips.some(t => Math.hypot(t.x - tip.x, t.y - tip.y) < 1e-6)
    }
    expect(hit('RE', 103.5)).toBe(true)
    expect(hit('LE', 84)).toBe(true)
    expect(hit('RE', 90)).toBe(false)
  })

  it('is a pair of sliders that announce their value', async () => {
    fakeLayout(640)
    const { wrapper, store } = await mountInBench(SimTrialFrame, learner)
    const sliders = wrapper.findAll('[role="slider"]')
    expect(sliders).toHaveLength(2)
    expect(sliders[0]!.attributes('aria-label')).toBe('Right eye dial')
    expect(sliders[1]!.attributes('aria-label')).toBe('Left eye dial')
    store.setRod('RE', 97)
    await nextTick()
    expect(sliders[0]!.attributes('aria-valuenow')).toBe('97')
    expect(sliders[0]!.attributes('aria-valuetext')).toBe('rod axis 97.0 degrees')
    expect(wrapper.get('[data-testid="readout-RE"]').text()).toContain('97.0°')
  })

  it('turns a dial from the keyboard: arrows ±1°, Shift ±5°, Home back to 90°', async () => {
    fakeLayout(640)
    const { wrapper, store } = await mountInBench(SimTrialFrame, learner)
    const re = wrapper.findAll('[role="slider"]')[0]!
    const le = wrapper.findAll('[role="slider"]')[1]!
    await re.trigger('keydown', { key: 'ArrowUp' })
    expect(store.rods.RE).toBe(91)
    await re.trigger('keydown', { key: 'ArrowLeft', shiftKey: true })
    expect(store.rods.RE).toBe(96)
    // → turns the rod clockwise as seen on screen: the figure falls
    await re.trigger('keydown', { key: 'ArrowRight' })
    expect(store.rods.RE).toBe(95)
    await le.trigger('keydown', { key: 'ArrowDown', shiftKey: true })
    expect(store.rods.LE).toBe(85)
    expect(store.rods.RE).toBe(95)
    await re.trigger('keydown', { key: 'Home' })
    expect(store.rods.RE).toBe(90)
    await re.trigger('keydown', { key: 'x' })
    expect(store.rods.RE).toBe(90)
    expect(re.attributes('aria-valuenow')).toBe('90')
  })

  it('hides the numeric readout when the learner must read the scale', async () => {
    fakeLayout(640)
    const { wrapper, store } = await mountInBench(SimTrialFrame, { ...learner, readScale: true })
    store.setRod('RE', 101)
    await nextTick()
    const readout = wrapper.get('[data-testid="readout-RE"]').text()
    expect(readout).toContain('read the scale')
    expect(readout).not.toMatch(/\d/)
    const slider = wrapper.findAll('[role="slider"]')[0]!
    expect(slider.attributes('aria-valuetext')).not.toMatch(/\d/)
  })

  it('in patient-turns shows the rods but offers no slider to turn them', async () => {
    fakeLayout(640)
    const { presentation: p } = engineCase('so-palsy-right', 'frame-test-1', 'patient-turns')
    const { wrapper, store } = await mountInBench(SimTrialFrame, { presentation: p, mode: 'patient-turns', readScale: false })
    expect(wrapper.findAll('[role="slider"]')).toHaveLength(0)
    expect(wrapper.findAll('[role="img"]')).toHaveLength(2)
    store.setRod('RE', 120)
    expect(store.rods.RE).toBe(90)
    // no figure under the dial: the box for the learner's own reading sits there instead (issue 13, point 3)
    const under = wrapper.get('[data-testid="readout-RE"]')
    expect(under.text()).toBe('Your reading, right-eye scale (°)')
    await under.get('input#typed-RE').setValue('97.5')
    expect(store.typed.RE).toBe(97.5)
  })
})
