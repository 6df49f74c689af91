// Autosave for a quiz item: every change goes to the server; a save that fails
// for want of a connection (or while the server restarts) is kept and retried,
// so nothing the student did is lost. A refusal (time up) stops saving.
import { useEventListener } from '@vueuse/core'
import type { BenchDraft } from '#shared/bench/contract'

export type SaveState = { kind: 'idle' } | { kind: 'saving' } | { kind: 'saved', at: string } | { kind: 'retrying', message: string } | { kind: 'refused', message: string }

export function useQuizAutosave(url: () => string, onRefused: (message: string) => void) {
  const state = ref<SaveState>({ kind: 'idle' })
  let pending: BenchDraft | null = null
  let running = false
  let timer: ReturnType<typeof setTimeout> | undefined

  async function flush() {
    if (running || !pending) return
    running = true
    const draft = pending
    state.value = { kind: 'saving' }
    try {
      const r = await $fetch<{ savedAt: string }>(url(), { method: 'PUT', body: draft })
      if (pending === draft) pending = null
      state.value = { kind: 'saved', at: r.savedAt }
    }
    catch (e) {
      const p = apiProblem(e)
      if (p.status && p.status >= 400 && p.status < 500) {
        pending = null
        state.value = { kind: 'refused', message: p.message }
        onRefused(p.message)
      }
      else {
        state.value = { kind: 'retrying', message: 'Not saved yet: the server cannot be reached. Retrying…' }
        timer = setTimeout(flush, 3000)
      }
    }
    finally {
      running = false
    }
    if (pending && state.value.kind === 'saved') await flush()
  }

  function save(draft: BenchDraft) {
    pending = draft
    clearTimeout(timer)
    void flush()
  }

  const unsaved = computed(() => state.value.kind === 'saving' || state.value.kind === 'retrying')
  if (import.meta.client) {
    useEventListener(window, 'beforeunload', (e: BeforeUnloadEvent) => {
      if (unsaved.value) e.preventDefault()
    })
  }
  onBeforeUnmount(() => clearTimeout(timer))
  return { state, save, unsaved }
}
