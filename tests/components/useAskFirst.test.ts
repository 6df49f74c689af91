// useAskFirst: the dialog's state around one action asked about first.
import { describe, expect, it } from 'vitest'
import { useAskFirst } from '~/composables/useAskFirst'

/** A promise the test settles by hand, to look at the state in between. */
function deferred() {
  let resolve!: () => void
  let reject!: (e: unknown) => void
  const promise = new Promise<void>((res, rej) => {
    resolve = res
    reject = rej
  })
  return { promise, resolve, reject }
}

// the shape $fetch (ofetch) gives a refused request: statusCode and the h3 error body in `data`
const refusal = { statusCode: 409, data: { message: 'The photograph is in a quiz.' } }

describe('useAskFirst', () => {
  it('opens on ask, is busy while the action runs on the subject, then closes', async () => {
    const call = deferred()
    const done: string[] = []
    const { subject, busy, dialog, ask } = useAskFirst(async (name: string) => {
      await call.promise
      done.push(name)
    })
    expect(dialog.value.open).toBe(false)
    ask('Fundus 1')
    expect(subject.value).toBe('Fundus 1')
    expect(dialog.value).toMatchObject({ open: true, busy: false })
    const confirming = dialog.value.onConfirm()
    expect(busy.value).toBe(true)
    expect(dialog.value.busy).toBe(true)
    call.resolve()
    await confirming
    expect(done).toEqual(['Fundus 1'])
    expect(dialog.value).toMatchObject({ open: false, busy: false })
    expect(subject.value).toBeNull()
  })

  it('does nothing on confirm when nothing was asked', async () => {
    let calls = 0
    const { confirm, busy } = useAskFirst(async () => {
      calls++
    })
    await confirm()
    expect(calls).toBe(0)
    expect(busy.value).toBe(false)
  })

  it('closes after a refusal and keeps the problem, or stays open when asked to', async () => {
    const closing = useAskFirst(async () => {
      throw refusal
    })
    closing.ask(1)
    await closing.confirm()
    expect(closing.subject.value).toBeNull()
    expect(closing.problem.value?.message).toBe('The photograph is in a quiz.')

    const said: string[] = []
    const staying = useAskFirst(async () => {
      throw refusal
    }, { keepOpenOnProblem: true, onProblem: p => said.push(p.message) })
    staying.ask(2)
    await staying.confirm()
    expect(staying.subject.value).toBe(2)
    expect(staying.dialog.value).toMatchObject({ open: true, busy: false })
    expect(said).toEqual(['The photograph is in a quiz.'])
  })

  it('closes on cancel, telling onCancel what was asked, and runs nothing', async () => {
    const cancelled: number[] = []
    let calls = 0
    const { ask, dialog, subject } = useAskFirst(async (_id: number) => {
      calls++
    }, { onCancel: s => cancelled.push(s) })
    ask(7)
    dialog.value.onCancel()
    expect(subject.value).toBeNull()
    expect(cancelled).toEqual([7])
    expect(calls).toBe(0)
    dialog.value.onCancel()
    expect(cancelled).toEqual([7])
  })
})
