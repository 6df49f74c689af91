import { quizStudentCaseParams } from '#shared/schemas/quiz'
import { quizForStaff, quizStudents } from '~~/server/utils/quiz/access'
import { QUIZ_STAFF } from '~~/server/utils/quiz/staff'
import { buildItemCase, readItemConfig } from '~~/server/utils/quiz/items'
import { quizCaseRow, quizItemOf } from '~~/server/utils/quiz/sitting'
import { regenerateCase } from '~~/server/utils/cases'
import { revealTruth } from '~~/server/utils/engine/attempt'
import { toPresentation } from '~~/server/utils/engine/presentation'

// Exactly what one student sees (or saw) on an item: the stored case if they have
// opened it, else the case the quiz seed derives for them — the same patient.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, ...QUIZ_STAFF)
  const { id, itemId, studentId } = paramsAs(event, quizStudentCaseParams)
  const db = await useDb()
  const quiz = await quizForStaff(db, user, id)
  const item = await quizItemOf(db, id, itemId)
  const student = (await quizStudents(db, id)).find(s => s.id === studentId)
  if (!student) notFound('That student')
  const config = readItemConfig(item)
  const row = await quizCaseRow(db, id, itemId, studentId)
  const c = row ? regenerateCase(row) : buildItemCase(config, quiz.seed, itemId, studentId).case
  return {
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
