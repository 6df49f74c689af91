/**
 * After a refused submit, move focus to the first field marked invalid
 * (aria-invalid="true") inside `root`, once the error messages are rendered,
 * so keyboard and screen-reader users land on what needs correcting.
 * Returns whether a field was focused.
 */
export async function focusFirstError(root: HTMLElement | null | undefined): Promise<boolean> {
  await nextTick()
  const field = root?.querySelector<HTMLElement>('[aria-invalid="true"]:not([disabled])')
  field?.focus()
  return !!field
}
