// Changing one mark of a quiz attempt from a tutor's attempt page: posts the
// override, puts the route's fresh view of the attempt into `view`, and keeps the
// form's state (pending, the problem to show, the confirmation).
import type { Ref } from 'vue'

export function useMarkOverride<T>(url: () => string, view: Ref<T | undefined | null>) {
  const pending = ref(false)
  const problem = ref<ApiProblem | null>(null)
  const notice = ref<string | null>(null)
  async function override(body: Record<string, unknown>) {
    pending.value = true
    problem.value = null
    notice.value = null
    try {
      view.value = await $fetch<T>(url(), { method: 'POST', body }) as T
      notice.value = 'Mark changed; the change is in the audit log.'
    }
    catch (e) {
      problem.value = apiProblem(e)
    }
    finally {
      pending.value = false
    }
  }
  return { pending, problem, notice, override }
}
