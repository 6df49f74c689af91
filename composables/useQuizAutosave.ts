// Autosave for quiz items: every change goes to the server; a save that fails for
// want of a connection (or while the server restarts) is kept and retried, so
// nothing the student did is lost. Saves are queued per draft URL, so a change the
// bench sends as it unmounts still reaches its own item. A refusal (time up) stops
// saving for that item.
import { useEventListener } from '@vueuse/core'
import type { BenchDraft } from '#shared/bench/contract'

export type SaveState = { kind: 'idle' } | { kind: 'saving' } | { kind: 'saved', at: string } | { kind: 'retrying', message: string } | { kind: 'refused', message: string }

export function useQuizAutosave(onRefused: (message: string) => void) {
  const state = ref<SaveState>({ kind: 'idle' })
  // a draft is the bench state (double Maddox rod items) or the marks so far (fundus items)
  const pending = new Map<string, object>()
  let running = false
  let timer: ReturnType<typeof setTimeout> | undefined

  async function flush(): Promise<void> {
    if (running) return
    const next = pending.entries().next()
    if (next.done) return
    const [url, draft] = next.value
    running = true
    state.value = { kind: 'saving' }
    let again = false
    try {
      const r = await $fetch<{ savedAt: string }>(url, { method: 'PUT', body: draft })
      if (pending.get(url) === draft) pending.delete(url)
      state.value = { kind: 'saved', at: r.savedAt }
      again = pending.size > 0
    }
    catch (e) {
      const p = apiProblem(e)
      if (p.status && p.status >= 400 && p.status < 500) {
        pending.delete(url)
        state.value = { kind: 'refused', message: p.message }
        onRefused(p.message)
        again = pending.size > 0
      }
      else {
        state.value = { kind: 'retrying', message: 'Not saved yet: the server cannot be reached. Retrying…' }
        timer = setTimeout(flush, 3000)
      }
    }
    finally {
      running = false
    }
    if (again) await flush()
  }

  function save(url: string, draft: BenchDraft | object) {
    pending.set(url, draft)
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
