import { describe, expect, it, vi } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import FundusMarker from '~/components/fundus/FundusMarker.vue'
import type { FundusPicture } from '#shared/engine/fundus/picture'

const picture: FundusPicture = {
  eye: 'RE',
  frame: { width: 8, height: 6 },
  field: { x: 4, y: 3, radius: 3.6 },
  disc: { x: 5.3, y: 2.7, width: 0.96, height: 1.08 },
  fovea: { x: 2.7, y: 3.0 },
  lookKey: 'f-test',
}

async function mountMarker(props: Record<string, unknown> = {}) {
  return mountSuspended(FundusMarker, { props: { source: { kind: 'picture', picture }, label: 'Test fundus', ...props } })
}

const last = <T>(list: T[][] | undefined): T => list![list!.length - 1]![0]!

describe('FundusMarker keyboard', () => {
  it('places the chosen mark with an arrow key and nudges it one screen pixel (Shift: ten)', async () => {
    const w = await mountMarker()
    const canvas = w.find('canvas')
    const scale = Number.parseFloat(canvas.attributes('style')!.match(/width: ([\d.]+)px/)![1]!) / picture.frame.width
    await canvas.trigger('keydown', { key: 'ArrowRight' })
    expect(last(w.emitted('update:disc') as { x: number, y: number }[][])).toEqual({ x: 4, y: 3 })
    await w.setProps({ disc: { x: 4, y: 3 } })
    await canvas.trigger('keydown', { key: 'ArrowRight' })
    expect(last(w.emitted('update:disc') as { x: number }[][]).x).toBeCloseTo(4 + 1 / scale, 9)
    await canvas.trigger('keydown', { key: 'ArrowUp', shiftKey: true })
    expect(last(w.emitted('update:disc') as { y: number }[][]).y).toBeCloseTo(3 - 10 / scale, 9)
  })

  it('switches marks with D and F, and moves only the chosen one', async () => {
    const w = await mountMarker({ disc: { x: 5, y: 3 }, fovea: { x: 2.5, y: 3.2 } })
    const canvas = w.find('canvas')
    await canvas.trigger('keydown', { key: 'f' })
    expect(last(w.emitted('update:active') as string[][])).toBe('fovea')
    await w.setProps({ active: 'fovea' })
    await canvas.trigger('keydown', { key: 'ArrowDown' })
    expect(w.emitted('update:fovea')).toHaveLength(1)
    expect(w.emitted('update:disc')).toBeUndefined()
    expect(w.text()).toMatch(/angle [\d.]+ degrees/)
  })

  it('keeps marks on the picture and ignores keys when disabled', async () => {
    const edge = await mountMarker({ disc: { x: 0, y: 0 } })
    await edge.find('canvas').trigger('keydown', { key: 'ArrowLeft', shiftKey: true })
    expect(last(edge.emitted('update:disc') as { x: number }[][]).x).toBe(0)
    const off = await mountMarker({ disabled: true })
    await off.find('canvas').trigger('keydown', { key: 'ArrowRight' })
    expect(off.emitted('update:disc')).toBeUndefined()
  })
  it('announces where the marks are in words once a keyboard move has settled', async () => {
    vi.useFakeTimers()
    try {
      const w = await mountMarker({ disc: { x: 4, y: 3 }, fovea: { x: 2, y: 3 } })
      const live = () => w.get('[data-testid="fundus-marker-status"]')
      expect(live().attributes('aria-live')).toBe('polite')
      await vi.advanceTimersByTimeAsync(500)
      // 4 of 8 across, 3 of 6 down; 2 of 8 across
      expect(live().text()).toMatch(/^Disc centre at 50% across, 50% down, fovea at 25% across, 50% down, angle [-\d.]+ degrees\. Moving the disc centre\.$/)
      await w.setProps({ disc: { x: 6, y: 1.5 } })
      expect(live().text()).toMatch(/Disc centre at 50% across/)
      await vi.advanceTimersByTimeAsync(500)
      expect(live().text()).toMatch(/^Disc centre at 75% across, 25% down/)
    }
    finally {
      vi.useRealTimers()
    }
  })
})
