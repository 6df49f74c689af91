// Start a practice case: a chosen template, "any" (the server chooses and keeps it
// hidden until an attempt is in), or "another like this" (like: caseId).
import { PRACTICE_ROLES } from '#shared/auth/roles'
import { randomInt } from 'node:crypto'
import { practiceStartSchema } from '#shared/schemas/practice'
import type { PracticeCase } from '#shared/types/practice'
import { withCaseErrors } from '~~/server/lib/practice/http'
import { findOwnedCase, insertCase, newCaseSeed, practiceCaseView } from '~~/server/lib/practice/cases'
import { baseTemplateId, practiceTemplateList, resolveTemplateId } from '~~/server/lib/practice/templates'
import { hiddenCaseSeed } from '~~/server/lib/practice/hidden-case'

export default defineEventHandler(async (event): Promise<PracticeCase> => {
  const user = await requireRole(event, ...PRACTICE_ROLES)
  const body = await readBodyAs(event, practiceStartSchema)
  const db = await useDb()
  const wanted = body.harder ? 'challenging' : body.difficulty

  let templateId: string | null
  let hidden: boolean
  let mode = body.mode ?? 'learner-turns'
  let readScale = body.readScale ?? false
  if (body.like !== undefined) {
    const source = await findOwnedCase(db, body.like, user.id)
    if (!source) badRequest([{ path: 'like', message: 'You have no practice case with that id.' }])
    if (!source.template_id) badRequest([{ path: 'like', message: 'That case was written by hand; there is no template to draw another from.' }])
    templateId = resolveTemplateId(baseTemplateId(source.template_id), wanted ?? (source.difficulty === 'challenging' ? 'challenging' : 'standard'))
    hidden = source.template_hidden === 1
    mode = body.mode ?? source.mode
    readScale = body.readScale ?? source.read_scale === 1
  }
  else if (body.template === undefined || body.template === 'any') {
    const list = practiceTemplateList()
    templateId = resolveTemplateId(list[randomInt(list.length)]!.id, wanted)
    hidden = true
  }
  else {
    templateId = resolveTemplateId(body.template, wanted)
    if (!templateId) {
      badRequest([{ path: 'template', message: `There is no case template “${body.template}”${wanted ? ` at ${wanted} difficulty` : ''}. See GET /api/practice/templates.` }])
    }
    hidden = false
  }
  if (!templateId) badRequest([{ path: 'difficulty', message: 'That case template has no such difficulty.' }])

  // a hidden case's seed is keyed with the server's secret: a seed the learner sent
  // (or saw) cannot be replayed with a named template to find the hidden one
  const seed = hidden ? hiddenCaseSeed(`${user.id}|${body.seed ?? newCaseSeed()}`) : body.seed ?? newCaseSeed()
  const { row, patient } = await withCaseErrors(() => insertCase(db, {
    ownerId: user.id,
    purpose: 'practice',
    templateId: templateId!,
    seed,
    templateHidden: hidden,
    mode,
    readScale,
  }))
  setResponseStatus(event, 201)
  return practiceCaseView(row, patient, false)
})
