// One submit at a time with its state: `pending` while `fn` runs, `problem` (what the
// server refused, fields included; see utils/api-problem.ts) when it throws. `run`
// passes its arguments to `fn` and resolves to its result, or to undefined after a
// refusal. Focus and aria stay with the form (focusFirstError after a refusal).
import type { ApiProblem } from '~/utils/api-problem'

export function useSubmit<A extends unknown[], R>(fn: (...args: A) => Promise<R>, options: { fallback?: string } = {}) {
  const pending = ref(false)
  const problem = ref<ApiProblem | null>(null)
  async function run(...args: A): Promise<R | undefined> {
    pending.value = true
    problem.value = null
    try {
      return await fn(...args)
    }
    catch (e) {
      problem.value = apiProblem(e, options.fallback)
      return undefined
    }
    finally {
      pending.value = false
    }
  }
  return { pending, problem, run }
}
