import { z } from 'zod'
import { ROLES } from '../auth/roles'
import { oneLineName } from './text'

export const emailField = z.string({ error: 'E-mail is required.' })
  .trim()
  .toLowerCase()
  .pipe(z.email({ error: 'Enter a valid e-mail address.' }).max(254, { error: 'E-mail is too long.' }))

export const passwordField = z.string({ error: 'Password is required.' })
  .min(12, { error: 'Use at least 12 characters for the password.' }) // OWASP ASVS 4.0 V2.1.1
  .max(200, { error: 'Password is too long (200 characters at most).' })

export const nameField = oneLineName('Name', 1, 120)

export const loginBody = z.object({
  email: emailField,
  password: z.string({ error: 'Password is required.' }).min(1, { error: 'Password is required.' }).max(200),
})

export const forgotBody = z.object({ email: emailField })

export const resetBody = z.object({
  token: z.string({ error: 'The reset link is incomplete.' }).min(10).max(200),
  password: passwordField,
})

export const acceptInvitationBody = z.object({
  name: nameField,
  password: passwordField,
})

/** Sign out everywhere: the body must say so, so a stray POST changes nothing. */
export const logoutEverywhereBody = z.object({
  everywhere: z.literal(true, { error: 'Send "everywhere": true to end every session.' }),
})

export const roleField = z.enum(ROLES, { error: `Role must be one of: ${ROLES.join(', ')}.` })

export type LoginBody = z.infer<typeof loginBody>
