// GET /api/quizzes/:id/items/:itemId/cases/:studentId (manager (a tutor: their cohorts'
// students)): exactly the patient that student gets on that item: `{ kind: 'dmr',
// stored, seed, presentation, draft, truth }`, or for a fundus item `{ kind: 'fundus',
// stored, seed, presentation \| photo, draft, reference, angles }`
import { QUIZ_STAFF } from '#shared/auth/roles'
import { quizStudentCaseParams } from '#shared/schemas/quiz'
import { quizForStaff, quizReach, quizStudents } from '~~/server/lib/quiz/access'
import { buildItemCase, readItemConfig } from '~~/server/lib/quiz/items'
import { quizCaseRow } from '~~/server/lib/quiz/sitting'
import { regenerateCase } from '~~/server/lib/practice/cases'
import { fundusDraftOf, fundusItemPictures, fundusPicturesOfCase, referencePoints } from '~~/server/lib/quiz/fundus-item'
import { revealTruth } from '~~/server/lib/engine/attempt'
import { toPresentation } from '~~/server/lib/engine/presentation'
import { quizItemOf } from '~~/server/lib/data/quiz-items'
import type { StaffCasePreview } from '#shared/types/quiz'

// Exactly what one student sees (or saw) on an item: the stored case if they have
// opened it, else the case the quiz seed derives for them — the same patient.
export default defineEventHandler(async (event): Promise<StaffCasePreview> => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id, itemId, studentId } = paramsAs(event, quizStudentCaseParams)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const item = await quizItemOf(db, id, itemId)
  const student = (await quizStudents(db, id, await quizReach(db, user, id))).find(s => s.id === studentId)
  if (!student) notFound('That student')
  const config = readItemConfig(item)
  const row = await quizCaseRow(db, id, itemId, studentId)
  if (config.kind === 'fundus') {
    // the same picture the student marks, with its reference points and angles
    const built = config.source.type === 'photo' ? null : row ?? null
    const c = config.source.type === 'photo' || row ? null : buildItemCase(config, quiz.seed, itemId, studentId)
    const pictures = built || config.source.type === 'photo'
      ? fundusItemPictures(config, built)
      : fundusPicturesOfCase(config, c!.case)
    return {
      kind: 'fundus' as const,
      student: { id: student.id, name: student.name },
      item: { id: item.id, position: item.position, prompt: item.prompt, eyes: pictures.eyes },
      stored: config.source.type === 'photo' || !!row,
      caseId: row?.id ?? null,
      seed: config.source.type === 'photo' ? null : row?.seed ?? c!.seed,
      presentation: pictures.presentation,
      photo: pictures.photo,
      draft: await fundusDraftOf(db, itemId, studentId),
      reference: referencePoints(pictures),
      angles: Object.fromEntries(pictures.eyes.map(e => [e, pictures.truth ? pictures.truth.eyes[e].angle : config.source.type === 'photo' ? config.source.angle : null])),
    }
  }
  const c = row ? regenerateCase(row) : buildItemCase(config, quiz.seed, itemId, studentId).case
  return {
    kind: 'dmr' as const,
    student: { id: student.id, name: student.name },
    item: { id: item.id, position: item.position, prompt: item.prompt, mode: config.mode, readScale: config.readScale },
    stored: !!row,
    caseId: row?.id ?? null,
    seed: row?.seed ?? c.seed,
    presentation: toPresentation(c, config.mode),
    draft: row?.draft_json ? JSON.parse(row.draft_json) : null,
    truth: revealTruth(c, 'primary', 'near', config.tolerance),
  }
})
