// A crisp, device-pixel-ratio-aware canvas in two layers, redrawn at most once per
// display frame: the static layer (the engraved frame, a fundus picture) is painted
// once per size into an off-screen canvas and copied in, so a redraw while a dial
// or a mark moves paints only what moved. The bench's trial frame and patient's view
// and the fundus marker all draw through it. Nothing here animates, so reduced
// motion asks nothing of it.
//
// The size in CSS pixels is either measured (`box` and `aspect`: width = the box's
// width, height = width × aspect, followed as the box resizes) or given (`size`,
// for a canvas whose page works out its size). A change of size or of the device
// pixel ratio (zoom, another screen) repaints both layers.

import { useDevicePixelRatio, useResizeObserver } from '@vueuse/core'

declare global {
  interface Window {
    /** Set by the benchmark (tests/perf) to collect redraw times, ms per frame. */
    __cyclodialMeasure?: boolean
    __cyclodialFrames?: Record<string, number[]>
    /** Set when measuring: repaint a canvas n times in a row, returning ms per repaint. */
    __cyclodialRepaint?: Record<string, (n: number) => number>
  }
}

/** Paints in CSS pixels: the context arrives scaled by the device pixel ratio. */
export type LayerPainter = (ctx: CanvasRenderingContext2D, width: number, height: number) => void

interface Layers {
  canvas: Ref<HTMLCanvasElement | null>
  /** Name under which redraw times are collected for the benchmark. */
  name: string
  /** The layer painted once per size (optional). */
  paintStatic?: LayerPainter
  /** The layer painted on every redraw, over the static one. */
  paint: LayerPainter
}

/** Sized by a box: width = the box's width, height = width × aspect. */
export interface MeasuredCanvasOptions extends Layers {
  box: Ref<HTMLElement | null>
  aspect: number
}

/** Sized by the caller, in CSS pixels. */
export interface SizedCanvasOptions extends Layers {
  size: Ref<{ width: number, height: number }>
}

export type LayeredCanvasOptions = MeasuredCanvasOptions | SizedCanvasOptions

export function useLayeredCanvas(o: LayeredCanvasOptions) {
  const measured = 'box' in o
  const boxWidth = ref(0)
  const width = computed(() => (measured ? boxWidth.value : o.size.value.width))
  const height = computed(() => (measured ? Math.round(boxWidth.value * o.aspect) : o.size.value.height))
  const { pixelRatio } = useDevicePixelRatio()
  let layer: HTMLCanvasElement | null = null
  let frame = 0

  if (measured) {
    useResizeObserver(o.box, (entries) => {
      const w = Math.floor(entries[0]?.contentRect.width ?? 0)
      if (w > 0 && w !== boxWidth.value) boxWidth.value = w
    })
  }

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

  /** Size the canvas afresh and repaint the static layer (then the rest, on the next frame). */
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

  watch([width, height, pixelRatio], rebuild)
  onMounted(() => {
    if (window.__cyclodialMeasure) {
      // the browser's clock is coarse (0.1 ms): the benchmark also times many repaints in a row
      ;(window.__cyclodialRepaint ??= {})[o.name] = (n: number) => {
        const t0 = performance.now()
        for (let i = 0; i < n; i++) paintNow()
        return (performance.now() - t0) / n
      }
    }
    if (measured) {
      const w = Math.floor(o.box.value?.getBoundingClientRect().width ?? 0)
      if (w > 0) boxWidth.value = w
    }
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
