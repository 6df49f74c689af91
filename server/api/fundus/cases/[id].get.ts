// The fundus photographs of one of the caller's practice cases: the dial-free
// pictures, earlier measurements with their feedback, and — once both a fundus
// measurement and a double Maddox rod record exist — subjective against objective.
import { idParam } from '#shared/schemas/common'
import type { CaseFundusView } from '#shared/types/fundus'
import { compareWithDmr } from '~~/server/lib/fundus/compare'
import { fundusForCase } from '~~/server/lib/fundus/generate'
import { toFundusPresentation } from '~~/server/lib/fundus/presentation'
import { dmrRecordedOn, ownCaseForFundus } from '~~/server/lib/fundus/case-fundus'
import { listFundusAttempts } from '~~/server/lib/fundus/attempts'

export default defineEventHandler(async (event): Promise<CaseFundusView> => {
  const user = await requireSignedIn(event)
  const { id } = paramsAs(event, idParam)
  const { row, case: c } = await ownCaseForFundus(user, id)
  const truth = fundusForCase(c)
  const attempts = await listFundusAttempts(user.id, { caseId: row.id })
  const dmrRecorded = await dmrRecordedOn(row.id)
  return {
    caseId: row.id,
    presentation: toFundusPresentation(truth),
    attempts,
    dmrRecorded,
    comparison: dmrRecorded && attempts.length ? compareWithDmr(c, truth) : null,
  }
})
