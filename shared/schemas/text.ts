// Plain one-line text for names (people, invitations, roster rows, cohorts): no
// control characters and no line breaks, which could split a CSV row or an e-mail
// header, or hide text. C0 and C1 control characters (Unicode general category Cc)
// and the Unicode line and paragraph separators U+2028 and U+2029.
import { z } from 'zod'

// eslint-disable-next-line no-control-regex
export const CONTROL_OR_LINE_BREAK = /[\u0000-\u001F\u007F-\u009F\u2028\u2029]/

export function hasControlCharacters(value: string): boolean {
  return CONTROL_OR_LINE_BREAK.test(value)
}

/** A one-line name field: refused (before trimming) when it holds a control character or line break. */
export function oneLineName(label: string, min: number, max: number) {
  return z.string({ error: `${label} is required.` })
    .refine(v => !hasControlCharacters(v), { error: `${label} cannot contain line breaks, tabs or other control characters.` })
    .trim()
    .min(min, { error: min > 1 ? `${label} needs at least ${min} characters.` : `${label} is required.` })
    .max(max, { error: `${label} is too long (${max} characters at most).` })
}
