// The one layered canvas behind the bench's trial frame and patient's view and the
// fundus marker: sized to its box (or a given size) and the device pixel ratio, the
// static layer painted once per size, the moving layer at most once per frame.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h, nextTick, ref } from 'vue'
import type { Ref } from 'vue'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { useLayeredCanvas } from '~/composables/useLayeredCanvas'
import type { LayerPainter } from '~/composables/useLayeredCanvas'
import { fakeLayout, nextFrame } from '~~/tests/support/bench-host'

let dprBefore: PropertyDescriptor | undefined
beforeEach(() => {
  dprBefore = Object.getOwnPropertyDescriptor(window, 'devicePixelRatio')
  Object.defineProperty(window, 'devicePixelRatio', { value: 2, configurable: true })
})
afterEach(() => {
  if (dprBefore) Object.defineProperty(window, 'devicePixelRatio', dprBefore)
  else delete (window as { devicePixelRatio?: number }).devicePixelRatio
  vi.restoreAllMocks()
})

interface Painters { paintStatic: ReturnType<typeof vi.fn<LayerPainter>>, paint: ReturnType<typeof vi.fn<LayerPainter>> }

const painters = (): Painters => ({ paintStatic: vi.fn<LayerPainter>(), paint: vi.fn<LayerPainter>() })

/** A box holding a canvas, drawn through useLayeredCanvas; `size` given means sized by the caller. */
async function mountCanvas(p: Painters, size?: Ref<{ width: number, height: number }>) {
  let api!: ReturnType<typeof useLayeredCanvas>
  const Host = defineComponent({
    setup() {
      const box = ref<HTMLElement | null>(null)
      const canvas = ref<HTMLCanvasElement | null>(null)
      api = size
        ? useLayeredCanvas({ canvas, size, name: 'test', ...p })
        : useLayeredCanvas({ canvas, box, aspect: 0.5, name: 'test', ...p })
      return () => h('div', { ref: box }, [h('canvas', { ref: canvas })])
    },
  })
  const wrapper = await mountSuspended(Host)
  // the layers are painted again once the fonts are ready (figures are engraved in them)
  await document.fonts?.ready
  await nextTick()
  return { wrapper, api, canvas: wrapper.get('canvas').element as HTMLCanvasElement }
}

describe('useLayeredCanvas', () => {
  it('sizes the canvas to its box and the device pixel ratio, and paints the static layer under the moving one', async () => {
    const rec = fakeLayout(640)
    const p = painters()
    const { canvas, api } = await mountCanvas(p)
    expect(api.width.value).toBe(640)
    expect(api.height.value).toBe(320) // 640 × aspect 0.5
    expect([canvas.width, canvas.height]).toEqual([1280, 640]) // device pixels at ratio 2
    expect([canvas.style.width, canvas.style.height]).toEqual(['640px', '320px'])
    expect(p.paintStatic).toHaveBeenCalled()
    for (const call of p.paintStatic.mock.calls) expect(call.slice(1)).toEqual([640, 320])

    rec.clear()
    await nextFrame()
    expect(p.paint).toHaveBeenCalledTimes(1)
    expect(p.paint.mock.calls[0]!.slice(1)).toEqual([640, 320])
    // the static layer is copied in unscaled, then the moving layer is painted in CSS pixels
    const fns = rec.calls.map(c => c.fn)
    const copied = fns.indexOf('drawImage')
    expect(copied).toBeGreaterThan(-1)
    expect(rec.calls[copied]!.args[0]).toBeInstanceOf(HTMLCanvasElement)
    const scaled = rec.calls.findIndex(c => c.fn === 'setTransform' && c.args[0] === 2 && c.args[3] === 2)
    expect(scaled).toBeGreaterThan(copied)
  })

  it('makes one redraw of the moving layer of several asks in a frame, and leaves the static layer alone', async () => {
    fakeLayout(640)
    const p = painters()
    const { api } = await mountCanvas(p)
    await nextFrame()
    p.paint.mockClear()
    p.paintStatic.mockClear()
    api.invalidate()
    api.invalidate()
    api.invalidate()
    expect(p.paint).not.toHaveBeenCalled()
    await nextFrame()
    expect(p.paint).toHaveBeenCalledTimes(1)
    expect(p.paintStatic).not.toHaveBeenCalled()
  })

  it('repaints both layers when a given size changes', async () => {
    fakeLayout(640)
    const p = painters()
    const size = ref({ width: 300, height: 200 })
    const { canvas } = await mountCanvas(p, size)
    expect([canvas.width, canvas.height]).toEqual([600, 400])
    expect(p.paintStatic.mock.calls.at(-1)!.slice(1)).toEqual([300, 200])
    const before = p.paintStatic.mock.calls.length

    size.value = { width: 410, height: 250 }
    await nextTick()
    expect([canvas.width, canvas.height]).toEqual([820, 500])
    expect([canvas.style.width, canvas.style.height]).toEqual(['410px', '250px'])
    expect(p.paintStatic).toHaveBeenCalledTimes(before + 1)
    expect(p.paintStatic.mock.calls.at(-1)!.slice(1)).toEqual([410, 250])
    await nextFrame()
    expect(p.paint.mock.calls.at(-1)!.slice(1)).toEqual([410, 250])
  })

  it('draws nothing after it is gone, even when a redraw was asked for', async () => {
    fakeLayout(640)
    const p = painters()
    const { wrapper, api } = await mountCanvas(p)
    await nextFrame()
    p.paint.mockClear()
    api.invalidate()
    wrapper.unmount()
    await nextFrame()
    expect(p.paint).not.toHaveBeenCalled()
  })
})
