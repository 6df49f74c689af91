// Schemas every area uses: a numeric route id and list paging. Area schemas
// (admin.ts, quiz.ts, casebook.ts …) build on these.
import { z } from 'zod'

/** `[id]` in a route: a positive whole number. */
export const idParam = z.object({
  id: z.coerce.number({ error: 'The id must be a number.' }).int().positive({ error: 'The id must be a positive whole number.' }),
})

/** Paging for the admin lists (audit log, outbox, invitations). */
export const pageQuery = z.object({
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(5).max(100).default(25),
})

/** List paging: `page` from 1, `pageSize` 1–LIST_PAGE_SIZE_MAX (default LIST_PAGE_SIZE). */
export const LIST_PAGE_SIZE = 50
export const LIST_PAGE_SIZE_MAX = 100
export const listPaging = {
  page: z.coerce.number({ error: 'Page must be a number.' }).int({ error: 'Page must be a whole number.' }).min(1, { error: 'Page starts at 1.' }).max(100_000, { error: 'Page is too large.' }).default(1),
  pageSize: z.coerce.number({ error: 'Page size must be a number.' }).int({ error: 'Page size must be a whole number.' }).min(1, { error: 'Page size is at least 1.' }).max(LIST_PAGE_SIZE_MAX, { error: `At most ${LIST_PAGE_SIZE_MAX} per page.` }).default(LIST_PAGE_SIZE),
}
