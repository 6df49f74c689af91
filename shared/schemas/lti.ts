// Learning platforms (LTI 1.3): what an administrator registers, and what a tutor
// sends when linking a course or choosing a quiz for a course.
import { z } from 'zod'
import { oneLineName } from './text'

const LOOPBACK = new Set(['127.0.0.1', 'localhost', '[::1]'])

/** An https URL, or http on a loopback address (a practice platform on this machine). */
export function platformUrl(label: string) {
  return z.string({ error: `${label} is required.` }).trim().max(1000, { error: `${label} is too long (1000 characters at most).` })
    .refine((v) => {
      try {
        const u = new URL(v)
        return u.protocol === 'https:' || (u.protocol === 'http:' && LOOPBACK.has(u.hostname))
      }
      catch {
        return false
      }
    }, { error: `${label} must be an https:// address (http:// only on this machine's loopback address).` })
}

const deploymentId = z.string({ error: 'Each deployment id must be text.' }).trim().min(1, { error: 'A deployment id cannot be empty.' }).max(255, { error: 'A deployment id is at most 255 characters.' })

export const platformBody = z.object({
  name: oneLineName('Name', 2, 120),
  issuer: platformUrl('Issuer'),
  clientId: z.string({ error: 'Client id is required.' }).trim().min(1, { error: 'Client id is required.' }).max(255, { error: 'Client id is at most 255 characters.' }),
  deploymentIds: z.array(deploymentId, { error: 'Deployment ids must be a list of text.' }).min(1, { error: 'Give at least one deployment id.' }).max(50, { error: 'At most 50 deployment ids.' }),
  authUrl: platformUrl('Authorisation URL'),
  tokenUrl: platformUrl('Token URL'),
  jwksUrl: platformUrl('Key set URL'),
})

export const platformPatchBody = platformBody.partial().extend({
  disabled: z.boolean({ error: 'Disabled must be true or false.' }).optional(),
}).refine(b => Object.keys(b).length > 0, { error: 'Nothing to change: send a field of the platform, or disabled.' })

export const launchParam = z.object({
  id: z.string().regex(/^[A-Za-z0-9_-]{20,64}$/, { error: 'That launch id is not valid.' }),
})

export const courseLinkBody = z.union([
  z.object({ cohortId: z.number({ error: 'Choose a cohort.' }).int().positive() }),
  z.object({ newCohortName: oneLineName('Cohort name', 2, 120) }),
], { error: 'Choose one of your cohorts (cohortId) or name a new one (newCohortName).' })

export const deepLinkForm = z.object({
  quizId: z.coerce.number({ error: 'Choose a quiz.' }).int({ error: 'Choose a quiz.' }).positive({ error: 'Choose a quiz.' }),
})
