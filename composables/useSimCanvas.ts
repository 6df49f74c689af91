// A crisp, device-pixel-ratio-aware canvas that redraws at most once per display
// frame. The engraved (static) layer is painted once per size and copied in, so a
// redraw while dragging only paints what moved.

import { useDevicePixelRatio, useResizeObserver } from '@vueuse/core'
import type { Ctx2d } from '~/utils/sim/draw-frame'

declare global {
  interface Window {
    /** Set by the benchmark (tests/perf) to collect redraw times, ms per frame. */
    __cyclodialMeasure?: boolean
    __cyclodialFrames?: Record<string, number[]>
    /** Set when measuring: repaint a canvas n times in a row, returning ms per repaint. */
    __cyclodialRepaint?: Record<string, (n: number) => number>
  }
}

export interface SimCanvasOptions {
  canvas: Ref<HTMLCanvasElement | null>
  box: Ref<HTMLElement | null>
  /** Height = width × aspect. */
  aspect: number
  /** Name under which redraw times are collected for the benchmark. */
  name: string
  paintStatic?: (ctx: Ctx2d, width: number, height: number) => void
  paint: (ctx: Ctx2d, width: number, height: number) => void
}

export function useSimCanvas(o: SimCanvasOptions) {
  const width = ref(0)
  const height = computed(() => Math.round(width.value * o.aspect))
  const { pixelRatio } = useDevicePixelRatio()
  let layer: HTMLCanvasElement | null = null
  let frame = 0

  useResizeObserver(o.box, (entries) => {
    const w = Math.floor(entries[0]?.contentRect.width ?? 0)
    if (w > 0 && w !== width.value) width.value = w
  })

  function context(c: HTMLCanvasElement | null): CanvasRenderingContext2D | null {
    return c ? c.getContext('2d') : null
  }

  function paintNow() {
    frame = 0
    const canvas = o.canvas.value
    const ctx = context(canvas)
    if (!canvas || !ctx || width.value === 0) return
    const measuring = import.meta.client && window.__cyclodialMeasure
    const t0 = measuring ? performance.now() : 0
    const dpr = pixelRatio.value || 1
    ctx.setTransform(1, 0, 0, 1, 0, 0)
    ctx.clearRect(0, 0, canvas.width, canvas.height)
    if (layer) ctx.drawImage(layer, 0, 0)
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0)
    o.paint(ctx, width.value, height.value)
    if (measuring) {
      const frames = (window.__cyclodialFrames ??= {})
      ;(frames[o.name] ??= []).push(performance.now() - t0)
    }
  }

  /** Ask for a redraw on the next display frame (several asks make one redraw). */
  function invalidate() {
    if (!import.meta.client || frame) return
    frame = requestAnimationFrame(paintNow)
  }

  function rebuild() {
    const canvas = o.canvas.value
    if (!canvas || width.value === 0) return
    const dpr = pixelRatio.value || 1
    const pw = Math.round(width.value * dpr)
    const ph = Math.round(height.value * dpr)
    canvas.width = pw
    canvas.height = ph
    canvas.style.width = `${width.value}px`
    canvas.style.height = `${height.value}px`
    layer = null
    if (o.paintStatic) {
      layer = document.createElement('canvas')
      layer.width = pw
      layer.height = ph
      const lctx = context(layer)
      if (lctx) {
        lctx.setTransform(dpr, 0, 0, dpr, 0, 0)
        o.paintStatic(lctx, width.value, height.value)
      }
    }
    invalidate()
  }

  watch([width, pixelRatio], rebuild)
  onMounted(() => {
    if (window.__cyclodialMeasure) {
      // the browser's clock is coarse (0.1 ms): the benchmark also times many repaints in a row
      ;(window.__cyclodialRepaint ??= {})[o.name] = (n: number) => {
        const t0 = performance.now()
        for (let i = 0; i < n; i++) paintNow()
        return (performance.now() - t0) / n
      }
    }
    const w = Math.floor(o.box.value?.getBoundingClientRect().width ?? 0)
    if (w > 0) width.value = w
    rebuild()
    // figures are engraved in the shipped fonts: repaint once they have loaded
    document.fonts?.ready.then(rebuild).catch(() => {})
  })
  onBeforeUnmount(() => {
    if (frame) cancelAnimationFrame(frame)
    frame = 0
  })

  return { width, height, invalidate, rebuild }
}
