// Turns a failed $fetch into the message and per-field problems the server sent.
export interface ApiProblem { message: string, fields: Record<string, string>, status?: number }

export function apiProblem(error: unknown, fallback = 'Something went wrong. Please try again.'): ApiProblem {
  const e = error as { statusCode?: number, status?: number, data?: { message?: string, data?: { fields?: { path: string, message: string }[] } } }
  const status = e?.statusCode ?? e?.status
  const fields: Record<string, string> = {}
  for (const f of e?.data?.data?.fields ?? []) fields[f.path] = f.message
  const message = e?.data?.message || (status ? fallback : 'Cyclodial could not be reached. Check your connection and try again.')
  return { message, fields, status }
}
