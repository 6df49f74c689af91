// Mounts one bench component with its bench state provided, the way <SimBench> does,
// and gives the canvas a size and a recording 2D context (Happy DOM has neither).
import { defineComponent, h, provide } from 'vue'
import type { Component } from 'vue'
import { vi } from 'vitest'
import { mountSuspended } from '@nuxt/test-utils/runtime'
import { BENCH_KEY, createBench } from '~/composables/useBench'
import type { BenchInit } from '~/composables/useBench'
import { recordingContext } from './canvas'
import type { RecordingContext } from './canvas'

/** Give every element a 640 px wide box and every canvas a recording context. */
export function fakeLayout(width = 640): RecordingContext {
  const rec = recordingContext()
  vi.spyOn(HTMLElement.prototype, 'getBoundingClientRect').mockImplementation(() =>
    ({ x: 0, y: 0, left: 0, top: 0, width, height: width / 2, right: width, bottom: width / 2, toJSON: () => ({}) }) as DOMRect,
  )
  vi.spyOn(HTMLCanvasElement.prototype, 'getContext').mockImplementation(() => rec.ctx as never)
  return rec
}

export async function mountInBench(component: Component, init: BenchInit, props: Record<string, unknown> = {}) {
  const store = createBench()
  store.load(init)
  const Host = defineComponent({
    setup() {
      provide(BENCH_KEY, store)
      return () => h(component, props)
    },
  })
  const wrapper = await mountSuspended(Host)
  return { wrapper, store }
}

/** Wait for the next display frame (the canvases redraw on it). */
export const nextFrame = () => new Promise<void>(resolve => requestAnimationFrame(() => resolve()))
