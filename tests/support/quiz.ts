// Helpers for the quiz API tests: cohort ids, a quiz built and published through
// the API, and the secrets of the case a student was given (from the engine, in
// the test process, never from a student-facing response).
import { expect } from 'vitest'
import type { Case } from '~~/server/lib/engine/types'
import { caseFromSpec, generateCase } from '~~/server/lib/engine/generator'
import type { Client } from './client'

export async function cohortIds(admin: Client): Promise<Record<string, number>> {
  const list = (await admin.get('/api/admin/cohorts')).body.items as { id: number, name: string }[]
  return Object.fromEntries(list.map(c => [c.name, c.id]))
}

export const minutesFromNow = (m: number) => new Date(Date.now() + m * 60_000).toISOString()

export interface BuiltQuiz { id: number, phase: string, items: { id: number, position: number, source: any }[], [key: string]: any }

/** Create a quiz with the given items and publish it. */
export async function publishQuiz(tutor: Client, settings: Record<string, unknown>, items: Record<string, unknown>[]): Promise<BuiltQuiz> {
  const created = await tutor.post('/api/quizzes', settings)
  expect(created.status, JSON.stringify(created.body)).toBe(201)
  let detail = created.body
  for (const item of items) {
    const added = await tutor.post(`/api/quizzes/${detail.id}/items`, item)
    expect(added.status, JSON.stringify(added.body)).toBe(201)
    detail = added.body
  }
  const published = await tutor.patch(`/api/quizzes/${detail.id}`, { published: true })
  expect(published.status, JSON.stringify(published.body)).toBe(200)
  return published.body
}

/** The patient a student's quiz case stands for, rebuilt in the test from the tutor's view of it. */
export function patientFor(item: { source: any }, seed: string, spec?: unknown): Case {
  if (item.source.type === 'case') {
    const built = caseFromSpec(spec)
    if (!built.ok) throw new Error('spec does not build')
    return built.case
  }
  return generateCase(item.source.templateId, seed)
}
