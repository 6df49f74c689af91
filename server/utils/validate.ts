// Reads and validates request input with a zod schema from shared/. Bad input
// becomes a 400 whose message names the fields; malformed JSON a 400 too.
import type { H3Event } from 'h3'
import type { z } from 'zod'

export interface FieldProblem { path: string, message: string }

export function zodProblems(error: z.ZodError): FieldProblem[] {
  return error.issues.map(issue => ({
    path: issue.path.map(String).join('.') || '(body)',
    message: issue.message,
  }))
}

export function badRequest(problems: FieldProblem[], code = 'invalid-input'): never {
  const summary = problems.map(p => (p.path === '(body)' ? p.message : `${p.path}: ${p.message}`)).join(' ')
  throw createError({
    statusCode: 400,
    statusMessage: 'Bad Request',
    message: summary || 'The request is not valid.',
    data: { code, fields: problems },
  })
}

function check<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const result = schema.safeParse(input)
  if (!result.success) badRequest(zodProblems(result.error))
  return result.data
}

export async function readBodyAs<S extends z.ZodType>(event: H3Event, schema: S): Promise<z.output<S>> {
  const raw = await readRawBody(event, 'utf8')
  let parsed: unknown = {}
  if (raw && raw.trim()) {
    try {
      parsed = JSON.parse(raw)
    }
    catch {
      badRequest([{ path: '(body)', message: 'The request body is not valid JSON.' }], 'malformed-json')
    }
  }
  return check(schema, parsed)
}

export function queryAs<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  return check(schema, getQuery(event))
}

export function paramsAs<S extends z.ZodType>(event: H3Event, schema: S): z.output<S> {
  return check(schema, getRouterParams(event, { decode: true }))
}
