import { z } from 'zod'
import { emailField, nameField, roleField } from './auth'
import { oneLineName } from './text'

export const userListQuery = z.object({
  q: z.string().trim().max(100).optional(),
  role: roleField.optional(),
  cohortId: z.coerce.number().int().positive().optional(),
  sort: z.enum(['name', 'email', 'role', 'created_at', 'last_login_at'], { error: 'Sort by name, email, role, created_at or last_login_at.' }).default('name'),
  dir: z.enum(['asc', 'desc'], { error: 'Direction must be asc or desc.' }).default('asc'),
  page: z.coerce.number().int().min(1, { error: 'Page starts at 1.' }).default(1),
  pageSize: z.coerce.number().int().min(5).max(100, { error: 'At most 100 rows per page.' }).default(20),
})

export const userPatchBody = z.object({
  name: nameField.optional(),
  role: roleField.optional(),
  disabled: z.boolean({ error: 'Disabled must be true or false.' }).optional(),
  cohortIds: z.array(z.number().int().positive(), { error: 'Cohorts must be a list of cohort ids.' }).max(50).optional(),
}).refine(b => Object.keys(b).length > 0, { error: 'Nothing to change: send name, role, disabled or cohortIds.' })

export const inviteBody = z.object({
  email: emailField,
  name: nameField.optional(),
  role: roleField,
  cohortId: z.number().int().positive().nullable().optional(),
})

export const cohortBody = z.object({
  name: oneLineName('Cohort name', 2, 120),
})
