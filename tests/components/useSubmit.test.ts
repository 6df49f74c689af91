// useSubmit: pending while the call runs, the server's refusal as a problem, nothing kept from an earlier try.
import { afterEach, describe, expect, it } from 'vitest'
import { ref } from 'vue'
import { useSubmit } from '~/composables/useSubmit'

/** A promise the test settles by hand, to look at the state in between. */
function deferred<T>() {
  let resolve!: (v: T) => void
  let reject!: (e: unknown) => void
  const promise = new Promise<T>((res, rej) => {
    resolve = res
    reject = rej
  })
  return { promise, resolve, reject }
}

// the shape $fetch (ofetch) gives a refused request: statusCode and the h3 error body in `data`
const refusal = { statusCode: 400, data: { message: 'Title is required.', data: { fields: [{ path: 'title', message: 'Title is required.' }] } } }

describe('useSubmit', () => {
  it('is pending while the call runs and hands back its result', async () => {
    const call = deferred<{ id: number }>()
    const seen: unknown[][] = []
    const { pending, problem, run } = useSubmit((a: string, b: number) => {
      seen.push([a, b])
      return call.promise
    })
    expect(pending.value).toBe(false)
    const result = run('x', 2)
    expect(pending.value).toBe(true)
    call.resolve({ id: 7 })
    await expect(result).resolves.toEqual({ id: 7 })
    expect(pending.value).toBe(false)
    expect(problem.value).toBeNull()
    expect(seen).toEqual([['x', 2]])
  })

  it('turns a refusal into a problem naming the field, and clears it on the next try', async () => {
    let fail = true
    const { pending, problem, run } = useSubmit(async () => {
      if (fail) throw refusal
      return 'saved'
    })
    await expect(run()).resolves.toBeUndefined()
    expect(pending.value).toBe(false)
    expect(problem.value).toEqual({ message: 'Title is required.', fields: { title: 'Title is required.' }, status: 400 })
    fail = false
    const next = run()
    expect(problem.value).toBeNull()
    await expect(next).resolves.toBe('saved')
  })

  it('says the server could not be reached when the error has no status', async () => {
    const { problem, run } = useSubmit(async () => {
      throw new TypeError('fetch failed')
    })
    await run()
    expect(problem.value?.status).toBeUndefined()
    expect(problem.value?.message).toMatch(/could not be reached/)
  })

  it('uses the caller\'s fallback wording for a refusal without a message', async () => {
    const { problem, run } = useSubmit(async () => {
      throw { statusCode: 500 }
    }, { fallback: 'The quiz was not saved.' })
    await run()
    expect(problem.value).toEqual({ message: 'The quiz was not saved.', fields: {}, status: 500 })
  })

  describe('after a refusal', () => {
    afterEach(() => {
      document.body.innerHTML = ''
    })

    it('runs onProblem with the problem, the error and run\'s arguments, then moves focus into the form, all while still pending', async () => {
      const form = document.createElement('form')
      form.innerHTML = '<input id="other"><input id="title"><p class="field-error">Title is required.</p>'
      document.body.append(form)
      const formEl = ref<HTMLFormElement | null>(form)
      const seen: string[] = []
      const { pending, problem, run } = useSubmit(async (_step: string) => {
        throw refusal
      }, {
        form: formEl,
        onProblem: (p, error, step) => {
          seen.push(`${step} pending=${pending.value} focus=${document.activeElement?.id || 'body'}`)
          expect(p).toEqual(problem.value)
          expect(error).toBe(refusal)
        },
      })
      await expect(run('check')).resolves.toBeUndefined()
      expect(seen).toEqual(['check pending=true focus=body'])
      const title = form.querySelector<HTMLInputElement>('#title')!
      expect(document.activeElement).toBe(title)
      expect(title.getAttribute('aria-invalid')).toBe('true')
      expect(title.getAttribute('aria-describedby')).toBe(form.querySelector('.field-error')!.id)
      expect(pending.value).toBe(false)
    })

    it('focuses the form\'s alert when the refusal names no field', async () => {
      const form = document.createElement('form')
      form.innerHTML = '<input id="email"><div role="alert">Sign-in failed.</div>'
      document.body.append(form)
      const { run } = useSubmit(async () => {
        throw { statusCode: 401, data: { message: 'Sign-in failed.' } }
      }, { form: () => form })
      await run()
      expect(document.activeElement).toBe(form.querySelector('[role="alert"]'))
    })

    it('moves no focus and calls nothing when the call succeeds', async () => {
      const form = document.createElement('form')
      form.innerHTML = '<input id="a"><p class="field-error">stale</p>'
      document.body.append(form)
      let called = 0
      const { run } = useSubmit(async () => 'ok', { form: () => form, onProblem: () => called++ })
      await expect(run()).resolves.toBe('ok')
      expect(called).toBe(0)
      expect(document.activeElement).toBe(document.body)
    })
  })
})
