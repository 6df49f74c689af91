// One submit at a time with its state: `pending` while `fn` runs, `problem` (what the
// server refused, fields included; see utils/api-problem.ts) when it throws. `run`
// passes its arguments to `fn` and resolves to its result, or to undefined after a
// refusal. After a refusal, and while still pending, `onProblem` runs first (clear a
// password, keep what the refusal carried), then focus moves to the first field in
// error inside `form` (focusFirstError: aria-invalid, aria-describedby, focus).
import type { MaybeRefOrGetter } from 'vue'
import type { ApiProblem } from '~/utils/api-problem'

export interface SubmitOptions<A extends unknown[] = unknown[]> {
  /** The message for a refusal that brings none. */
  fallback?: string
  /** The form (or the box around form and alert) whose first error takes focus after a refusal. */
  form?: MaybeRefOrGetter<HTMLElement | null | undefined>
  /** Runs after a refusal, before focus moves, with the arguments `run` was given. */
  onProblem?: (problem: ApiProblem, error: unknown, ...args: A) => unknown
}

export function useSubmit<A extends unknown[], R>(fn: (...args: A) => Promise<R>, options: SubmitOptions<A> = {}) {
  const pending = ref(false)
  const problem = ref<ApiProblem | null>(null)
  async function run(...args: A): Promise<R | undefined> {
    pending.value = true
    problem.value = null
    try {
      return await fn(...args)
    }
    catch (e) {
      const found = apiProblem(e, options.fallback)
      problem.value = found
      await options.onProblem?.(found, e, ...args)
      if (options.form !== undefined) await focusFirstError(toValue(options.form))
      return undefined
    }
    finally {
      pending.value = false
    }
  }
  return { pending, problem, run }
}
