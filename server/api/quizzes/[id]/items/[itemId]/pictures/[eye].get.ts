// One eye of a generated fundus item, as the student sitting it sees it: a PNG
// rendered on the server from the student's own stored case, so the browser never
// holds the picture's disc and fovea coordinates. Each student's URL draws their
// own case; a photograph item has its own image route; never cached by shared caches.
import { quizItemPictureParams } from '#shared/schemas/quiz'
import { quizForStudent } from '~~/server/lib/quiz/access'
import { readItemConfig } from '~~/server/lib/quiz/items'
import { ensureQuizCase, sittingOf } from '~~/server/lib/quiz/sitting'
import { fundusItemPictures } from '~~/server/lib/quiz/fundus-item'
import { renderFundusPng } from '~~/server/lib/fundus/render'
import { quizItemOf } from '~~/server/lib/data/quiz-items'

export default defineEventHandler(async (event): Promise<Buffer> => {
  const user = await requireRole(event, 'student')
  const { id, itemId, eye } = paramsAs(event, quizItemPictureParams)
  const db = await useDb()
  const quiz = await quizForStudent(db, user, id)
  const item = await quizItemOf(db, id, itemId)
  const config = readItemConfig(item)
  if (config.kind !== 'fundus' || config.source.type === 'photo') notFound('That picture')
  if (!(await sittingOf(db, id, user.id))) {
    throw createError({ statusCode: 409, statusMessage: 'Conflict', message: 'Start the quiz first.', data: { code: 'quiz-not-started' } })
  }
  const row = await ensureQuizCase(db, quiz, item, user.id, nowIso())
  const pictures = fundusItemPictures(config, row)
  if (!pictures.presentation || !pictures.eyes.includes(eye)) notFound('That picture')
  const png = await renderFundusPng(pictures.presentation.eyes[eye])
  setResponseHeaders(event, {
    'Content-Type': 'image/png',
    'Content-Length': String(png.length),
    'Cache-Control': 'private, no-store',
    'Content-Disposition': 'inline',
    'X-Content-Type-Options': 'nosniff',
  })
  return png
})
