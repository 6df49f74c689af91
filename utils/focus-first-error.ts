// Form errors for keyboard and screen-reader users (WCAG 2.1 SC 3.3.1, 1.3.1, 2.4.3).
//
// Every form shows a field's error as a `.field-error` element right after the field
// (or after the fieldset of a group). `tieFieldErrors(form)` ties each shown error to
// its field: `aria-invalid="true"` and the error's id in `aria-describedby`, and
// unties them when the error goes. `focusFirstError(form)` does that, keeps it in
// step from then on (a MutationObserver on the form), and moves focus to the first
// field in error — or, when the refusal names no field, to the form's alert.

const CONTROL = 'input:not([type="hidden"]), select, textarea'
/** Marks what this module added, so it removes only its own attributes. */
const TIED = 'data-tied-error'
let nextId = 0
const watched = new WeakSet<HTMLElement>()

/** The field(s) a shown error belongs to: the controls of the fieldset just before it or around it, else the nearest control before it in its box. */
function fieldsFor(error: HTMLElement, root: HTMLElement): HTMLElement[] {
  const before = error.previousElementSibling
  if (before instanceof HTMLFieldSetElement) return [...before.querySelectorAll<HTMLElement>(CONTROL)]
  for (let box = error.parentElement; box && root.contains(box); box = box.parentElement) {
    // an error inside a group (a range, a set of boxes) is about the whole group
    if (box instanceof HTMLFieldSetElement) return [...box.querySelectorAll<HTMLElement>(CONTROL)]
    const preceding = [...box.querySelectorAll<HTMLElement>(CONTROL)]
      .filter(c => c.compareDocumentPosition(error) & Node.DOCUMENT_POSITION_FOLLOWING)
    if (preceding.length) return [preceding.at(-1)!]
    if (box === root) break
  }
  return []
}

function untie(field: HTMLElement) {
  const id = field.getAttribute(TIED)
  if (id === null) return
  const rest = (field.getAttribute('aria-describedby') ?? '').split(/\s+/).filter(t => t && t !== id)
  if (rest.length) field.setAttribute('aria-describedby', rest.join(' '))
  else field.removeAttribute('aria-describedby')
  field.removeAttribute('aria-invalid')
  field.removeAttribute(TIED)
}

/** Tie every shown `.field-error` inside `root` to its field, and untie fields whose error has gone. */
export function tieFieldErrors(root: HTMLElement | null | undefined): void {
  if (!root) return
  const tied = new Set<HTMLElement>()
  for (const error of root.querySelectorAll<HTMLElement>('.field-error')) {
    if (!error.id) error.id = `field-error-${++nextId}`
    for (const field of fieldsFor(error, root)) {
      if (tied.has(field)) continue
      const mine = field.getAttribute(TIED)
      if (mine && mine !== error.id) untie(field)
      const ids = (field.getAttribute('aria-describedby') ?? '').split(/\s+/).filter(Boolean)
      if (!ids.includes(error.id)) {
        field.setAttribute('aria-describedby', [...ids, error.id].join(' '))
        field.setAttribute(TIED, error.id)
      }
      else if (!field.hasAttribute(TIED)) {
        // the page already points at this error: only aria-invalid is ours
        field.setAttribute(TIED, '')
      }
      field.setAttribute('aria-invalid', 'true')
      tied.add(field)
    }
  }
  for (const field of root.querySelectorAll<HTMLElement>(`[${TIED}]`)) {
    if (!tied.has(field)) untie(field)
  }
}

function keepTied(root: HTMLElement) {
  if (watched.has(root) || typeof MutationObserver === 'undefined') return
  watched.add(root)
  new MutationObserver(() => tieFieldErrors(root)).observe(root, { childList: true, subtree: true })
}

/**
 * After a refused submit, move focus to the first field in error inside `root`
 * (once the error messages are rendered), so keyboard and screen-reader users land
 * on what needs correcting; with no field in error, to the form's alert.
 * Returns whether something was focused.
 */
export async function focusFirstError(root: HTMLElement | null | undefined): Promise<boolean> {
  await nextTick()
  if (!root) return false
  tieFieldErrors(root)
  keepTied(root)
  const field = root.querySelector<HTMLElement>('[aria-invalid="true"]:not([disabled])')
  if (field) {
    field.focus()
    return true
  }
  const alert = root.querySelector<HTMLElement>('[role="alert"]')
  if (alert) {
    if (!alert.hasAttribute('tabindex')) alert.setAttribute('tabindex', '-1')
    alert.focus()
    return true
  }
  return false
}
