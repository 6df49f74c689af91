// Turns the typed errors of cases.ts / attempts.ts into HTTP answers that name
// the field (400, or the 409 the error asks for). Anything else is re-thrown.
import { CaseInputError } from './cases'

export async function withCaseErrors<T>(work: () => Promise<T>): Promise<T> {
  try {
    return await work()
  }
  catch (error) {
    if (!(error instanceof CaseInputError)) throw error
    const fields = [{ path: error.field, message: error.message }]
    if (error.status === 400) badRequest(fields, error.code)
    throw createError({ statusCode: error.status, message: error.message, data: { code: error.code, fields } })
  }
}
