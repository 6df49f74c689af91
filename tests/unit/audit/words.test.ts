// The audit log in words: every action the server writes has words, and no row reads
// as a code or as JSON.
import { describe, expect, it } from 'vitest'
import { AUDIT_ACTIONS, auditActionWords, auditChangeWords, auditTargetWords } from '#shared/audit/words'
import { writtenAuditActions } from '../../support/audit-actions'

const names = {
  user: (id: number) => ({ 5: 'Tamsin Arkwell' } as Record<number, string>)[id],
  cohort: (id: number) => ({ 1: 'Kestrel cohort', 2: 'Heron cohort' } as Record<number, string>)[id],
  quiz: (id: number) => ({ 3: 'Week 3: writing the record' } as Record<number, string>)[id],
}
const CODE = /\b[a-z]+(?:[-_.][a-z]+)+\b|[{}"]/

describe('audit log in words', () => {
  it('has words for every action the server writes', () => {
    const written = writtenAuditActions()
    expect(written.length).toBeGreaterThan(15)
    for (const a of written) expect(AUDIT_ACTIONS, a).toContain(a)
  })

  it('says what changed, field by field, old → new', () => {
    expect(auditChangeWords('user.role-changed', { from: 'student', to: 'tutor' }, names)).toEqual(['Role: student → tutor'])
    expect(auditChangeWords('user.disabled-changed', { from: false, to: true }, names)).toEqual(['Account: enabled → disabled'])
    expect(auditChangeWords('user.cohorts-changed', { from: [1], to: [2] }, names)).toEqual(['Cohorts: Kestrel cohort → Heron cohort'])
    expect(auditChangeWords('quiz.updated', { closes_at: '2026-03-02T12:00:00.000Z', time_limit_minutes: 45, previous: { closes_at: '2026-03-01T12:00:00.000Z', time_limit_minutes: null } }, names))
      .toEqual(['Closes: 1 Mar 2026, 12:00 UTC → 2 Mar 2026, 12:00 UTC', 'Time limit: none → 45 min'])
    expect(auditChangeWords('quiz.mark-overridden', { quizId: 3, studentId: 5, criterion: 'test', from: 0, to: 0.5, reason: 'Named in full.' }, names))
      .toEqual(['Quiz: “Week 3: writing the record”', 'Student: Tamsin Arkwell', 'Test named: 0 → 0.5', 'Reason: “Named in full.”'])
    expect(auditTargetWords('user', '5', names)).toBe('Tamsin Arkwell')
  })

  it('never reads as a code, even for an action without words of its own', () => {
    for (const a of [...AUDIT_ACTIONS, 'photo.re-scaled']) {
      expect(auditActionWords(a), a).not.toMatch(CODE)
    }
    // a quiz change stored before old values were kept reads "set to"
    const lines = auditChangeWords('quiz.updated', { published_at: '2026-01-01T09:00:00.000Z', hold_feedback: 1, cohortIds: [1] }, names)
    expect(lines).toEqual(['Published set to published 1 Jan 2026, 09:00 UTC', 'Feedback held until release set to on', 'Cohorts set to Kestrel cohort'])
    for (const l of [...lines, ...auditChangeWords('photo.re-scaled', { new_width: 800, kept: true }, names)]) expect(l).not.toMatch(/[{}"_]/)
  })
})
