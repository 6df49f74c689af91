// Errors tied to their fields and focus moved to the first (WCAG 2.1 SC 3.3.1 Error
// Identification, 1.3.1 Info and Relationships; WAI-ARIA 1.2 aria-invalid, aria-describedby).
import { afterEach, describe, expect, it } from 'vitest'
import { focusFirstError, tieFieldErrors } from '~/utils/focus-first-error'

function form(html: string): HTMLFormElement {
  const f = document.createElement('form')
  f.innerHTML = html
  document.body.append(f)
  return f
}
afterEach(() => {
  document.body.innerHTML = ''
})
const tick = () => new Promise(r => setTimeout(r, 0))

describe('tieFieldErrors', () => {
  it('ties each shown error to the field before it, keeping the field\'s own descriptions', () => {
    const f = form(`
      <div><label for="a">A</label><input id="a" aria-describedby="a-help"><p id="a-help">help</p><p class="field-error">A is wrong</p></div>
      <div><label for="b">B</label><select id="b"></select></div>
      <div><label for="c">C</label><textarea id="c"></textarea><p class="field-error" id="c-error">C is wrong</p></div>`)
    tieFieldErrors(f)
    const a = f.querySelector('#a')!
    const errorA = f.querySelectorAll('.field-error')[0]!
    expect(errorA.id).toBeTruthy()
    expect(a.getAttribute('aria-invalid')).toBe('true')
    expect(a.getAttribute('aria-describedby')).toBe(`a-help ${errorA.id}`)
    expect(f.querySelector('#b')!.hasAttribute('aria-invalid')).toBe(false)
    expect(f.querySelector('#c')!.getAttribute('aria-describedby')).toBe('c-error')
  })

  it('ties a group\'s error to every control of the group', () => {
    const f = form(`<fieldset><legend>Cohorts</legend><input type="checkbox" id="k1"><input type="checkbox" id="k2"></fieldset><p class="field-error">Choose one</p>
      <fieldset><legend>Range</legend><div><input id="lo"><input id="hi"></div><p class="field-error">Low above high</p></fieldset>`)
    tieFieldErrors(f)
    for (const id of ['k1', 'k2', 'lo', 'hi']) expect(f.querySelector(`#${id}`)!.getAttribute('aria-invalid'), id).toBe('true')
  })

  it('unties a field once its error has gone, leaving what the page set', () => {
    const f = form(`<div><input id="a" aria-describedby="a-help"><p class="field-error">A is wrong</p></div>`)
    tieFieldErrors(f)
    f.querySelector('.field-error')!.remove()
    tieFieldErrors(f)
    const a = f.querySelector('#a')!
    expect(a.hasAttribute('aria-invalid')).toBe(false)
    expect(a.getAttribute('aria-describedby')).toBe('a-help')
  })
})

describe('focusFirstError', () => {
  it('focuses the first field in error, and keeps the ties in step as errors come and go', async () => {
    const f = form(`<div><input id="a"></div><div><input id="b"><p class="field-error">B is wrong</p></div>`)
    expect(await focusFirstError(f)).toBe(true)
    expect(document.activeElement?.id).toBe('b')
    // an error appears on A later (the page re-rendered): tied without another call
    const p = document.createElement('p')
    p.className = 'field-error'
    p.textContent = 'A is wrong'
    f.querySelector('#a')!.after(p)
    await tick()
    expect(f.querySelector('#a')!.getAttribute('aria-invalid')).toBe('true')
    f.querySelectorAll('.field-error').forEach(e => e.remove())
    await tick()
    expect(f.querySelectorAll('[aria-invalid]')).toHaveLength(0)
  })

  it('with no field in error, focuses the form\'s alert', async () => {
    const f = form(`<div role="alert">Wrong e-mail or password.</div><div><input id="a"></div>`)
    expect(await focusFirstError(f)).toBe(true)
    expect(document.activeElement?.getAttribute('role')).toBe('alert')
    expect(document.activeElement?.getAttribute('tabindex')).toBe('-1')
  })

  it('says so when there is nothing to focus', async () => {
    expect(await focusFirstError(form('<div><input id="a"></div>'))).toBe(false)
    expect(await focusFirstError(null)).toBe(false)
  })
})
