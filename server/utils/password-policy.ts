// Password rules for every place a password is chosen (reset, invitation
// acceptance): OWASP ASVS 4.0 V2.1.1 (at least 12 characters) and V2.1.7
// (refuse breached or common passwords), judged by the zxcvbn strength
// estimator with its common and English word lists. A password that contains
// the person's e-mail (its local part) or name is refused too.
import { ZxcvbnFactory } from '@zxcvbn-ts/core'
import * as common from '@zxcvbn-ts/language-common'
import * as en from '@zxcvbn-ts/language-en'

/** zxcvbn scores 0–4; 3 is "safely unguessable" in its own scale (from memory of its README). */
export const MIN_STRENGTH_SCORE = 3
export const MIN_PASSWORD_LENGTH = 12 // OWASP ASVS 4.0 V2.1.1

let estimator: ZxcvbnFactory | undefined
function zxcvbn(): ZxcvbnFactory {
  estimator ??= new ZxcvbnFactory({
    translations: en.translations,
    graphs: common.adjacencyGraphs,
    dictionary: { ...common.dictionary, ...en.dictionary },
    // Near-miss matching costs about a second per check here (measured); the
    // exact, reversed and l33t dictionary matches already catch common passwords.
    useLevenshteinDistance: false,
  })
  return estimator
}

export interface PasswordPerson { email?: string | null, name?: string | null }

/** Pieces of the person's identity a password must not contain (3+ letters each). */
function personalParts(person: PasswordPerson): string[] {
  const parts = new Set<string>()
  const local = (person.email ?? '').split('@')[0]?.toLowerCase() ?? ''
  if (local.length >= 3) parts.add(local)
  for (const piece of local.split(/[^\p{L}\p{N}]+/u)) if (piece.length >= 3) parts.add(piece)
  for (const piece of (person.name ?? '').toLowerCase().split(/[^\p{L}\p{N}]+/u)) if (piece.length >= 3) parts.add(piece)
  return [...parts]
}

/**
 * Why this password is refused, in words for the person choosing it, or null
 * when it is acceptable. The length limits are also in the zod schema; they are
 * repeated here so the rule holds wherever this is called.
 */
export function passwordProblem(password: string, person: PasswordPerson = {}): string | null {
  if (password.length < MIN_PASSWORD_LENGTH) return `Use at least ${MIN_PASSWORD_LENGTH} characters for the password.`
  const lower = password.toLowerCase()
  const personal = personalParts(person)
  if (personal.some(p => lower.includes(p))) {
    return 'The password must not contain your name or the first part of your e-mail address.'
  }
  const result = zxcvbn().check(password.slice(0, 100), personal)
  const whole = result.sequence.length === 1 && result.sequence[0]!.pattern === 'dictionary'
  if (whole || /common/i.test(result.feedback.warning ?? '') || result.sequence.some(m => m.pattern === 'dictionary' && (m as { dictionaryName?: string }).dictionaryName === 'passwords' && m.token.length >= password.length - 2)) {
    return 'That password is too common. Choose something less predictable, such as several unrelated words.'
  }
  if (result.score < MIN_STRENGTH_SCORE) {
    const hint = result.feedback.warning ? ` ${result.feedback.warning.replace(/\.?$/, '')}.` : ''
    return `That password is too easy to guess.${hint} Add more unrelated words or mix in unusual ones.`
  }
  return null
}

/** 400 naming the field when the password is refused. */
export function assertPasswordAcceptable(password: string, person: PasswordPerson, field = 'password'): void {
  const problem = passwordProblem(password, person)
  if (problem) badRequest([{ path: field, message: problem }], 'weak-password')
}
