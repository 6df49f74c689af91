// A learner's disc–fovea measurement of both eyes of their practice case, graded
// against the case's fundus. The angle is computed here from the marks.
import { idParam } from '#shared/schemas/common'
import { caseFundusAttemptBody } from '#shared/schemas/fundus'
import { compareWithDmr } from '~~/server/lib/fundus/compare'
import { fundusForCase } from '~~/server/lib/fundus/generate'
import { gradeFundus } from '~~/server/lib/fundus/grade'
import { dmrRecordedOn, learnerCohortId, ownCaseForFundus } from '~~/server/lib/fundus/case-fundus'
import { assertMarksOnPicture, storeFundusAttempt } from '~~/server/lib/fundus/attempts'
import type { CaseFundusAttemptReply } from '#shared/types/fundus'

export default defineEventHandler(async (event): Promise<CaseFundusAttemptReply> => {
  const user = await requireSignedIn(event)
  const { id } = paramsAs(event, idParam)
  const body = await readBodyAs(event, caseFundusAttemptBody)
  const { row, case: c } = await ownCaseForFundus(user, id)
  const truth = fundusForCase(c)
  assertMarksOnPicture(body.eyes, truth.eyes.RE.picture.frame, 'eyes.')
  const ref = (eye: 'RE' | 'LE') => ({ eye, disc: truth.eyes[eye].picture.disc, fovea: truth.eyes[eye].picture.fovea, ddUnit: 1 })
  const result = gradeFundus({ references: { RE: ref('RE'), LE: ref('LE') }, marks: body.eyes })
  const attempt = await storeFundusAttempt({
    learnerId: user.id,
    cohortId: await learnerCohortId(user),
    kind: 'practice',
    caseId: row.id,
    fundusVersion: truth.fundusVersion,
    marks: body.eyes,
    result,
  })
  const dmrRecorded = await dmrRecordedOn(row.id)
  setResponseStatus(event, 201)
  return { attemptId: attempt.id, result, dmrRecorded, comparison: dmrRecorded ? compareWithDmr(c, truth) : null }
})
