// Asking before something that cannot be undone, with <UiConfirm>: `ask(subject)` opens
// the dialog about `subject`; `confirm` runs `act(subject)` through useSubmit (`busy`,
// `problem`, the same options) and then closes it, unless `keepOpenOnProblem` and the
// server refused; `cancel` closes it (after `onCancel`, e.g. to put back a select).
// `dialog` is UiConfirm's open and busy state with its two events: `v-bind="dialog"`.
import type { SubmitOptions } from './useSubmit'

export interface AskFirstOptions<T> extends SubmitOptions<[T]> {
  /** Leave the dialog open after a refusal (the page says why beside it). */
  keepOpenOnProblem?: boolean
  /** Runs when the person cancels, with the subject they were asked about. */
  onCancel?: (subject: T) => void
}

export function useAskFirst<T>(act: (subject: T) => Promise<unknown>, options: AskFirstOptions<T> = {}) {
  const subject = shallowRef<T | null>(null)
  const { pending: busy, problem, run } = useSubmit(act, options)
  function ask(about: T) {
    subject.value = about
  }
  function cancel() {
    const about = subject.value
    if (about !== null) options.onCancel?.(about)
    subject.value = null
  }
  async function confirm() {
    const about = subject.value
    if (about === null) return
    await run(about)
    if (!(problem.value && options.keepOpenOnProblem)) subject.value = null
  }
  const dialog = computed(() => ({ open: subject.value !== null, busy: busy.value, onConfirm: confirm, onCancel: cancel }))
  return { subject, busy, problem, ask, cancel, confirm, dialog }
}
