// Turning a dial by mouse, pen or touch. The pointer is captured on press, so the
// drag carries on outside the cell; the further the pointer from the centre, the
// finer the turn (see dragGain).

import { useEventListener } from '@vueuse/core'
import type { Eye } from '#shared/engine/types'
import type { CellLayout } from '~/utils/sim/frame-geometry'
import { axisAtPoint, distance, dragGain, dragStep } from '~/utils/sim/frame-geometry'

export interface DialDragOptions {
  eye: Eye
  /** The element the learner presses (it covers the cell). */
  target: Ref<HTMLElement | null>
  /** The canvas whose coordinates the layout uses. */
  surface: Ref<HTMLElement | null>
  cell: () => CellLayout | null
  enabled: () => boolean
  reading: () => number
  set: (value: number) => void
  onStart?: () => void
  onEnd?: () => void
}

export function useDialDrag(o: DialDragOptions) {
  const dragging = ref(false)
  let pointerId: number | null = null
  let lastAxis = 0

  const local = (e: PointerEvent) => {
    const r = o.surface.value!.getBoundingClientRect()
    return { x: e.clientX - r.left, y: e.clientY - r.top }
  }

  useEventListener(o.target, 'pointerdown', (e: PointerEvent) => {
    const cell = o.cell()
    if (!o.enabled() || !cell || !o.surface.value || (e.pointerType === 'mouse' && e.button !== 0)) return
    e.preventDefault()
    o.target.value?.focus({ preventScroll: true })
    try {
      o.target.value?.setPointerCapture?.(e.pointerId)
    }
    catch {
      // the pointer is already gone (or was never a real one): drag without capture
    }
    pointerId = e.pointerId
    lastAxis = axisAtPoint(cell, local(e))
    dragging.value = true
    o.onStart?.()
  })

  useEventListener(o.target, 'pointermove', (e: PointerEvent) => {
    const cell = o.cell()
    if (!dragging.value || e.pointerId !== pointerId || !cell || !o.surface.value) return
    // several coalesced moves per frame are applied in one go by the canvas' frame scheduling
    const p = local(e)
    const axis = axisAtPoint(cell, p)
    const r = distance({ x: cell.cx, y: cell.cy }, p)
    // right at the centre the pointer's angle jumps about: follow it without turning the rod
    if (r < cell.radius * 0.12) {
      lastAxis = axis
      return
    }
    const gain = dragGain(r, cell.radius)
    o.set(dragStep(o.reading(), lastAxis, axis, gain))
    lastAxis = axis
  })

  const end = (e: PointerEvent) => {
    if (e.pointerId !== pointerId) return
    if (o.target.value?.hasPointerCapture?.(e.pointerId)) o.target.value.releasePointerCapture(e.pointerId)
    pointerId = null
    if (dragging.value) {
      dragging.value = false
      o.onEnd?.()
    }
  }
  useEventListener(o.target, 'pointerup', end)
  useEventListener(o.target, 'pointercancel', end)

  return { dragging }
}
