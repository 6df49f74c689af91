import { describe, expect, it } from 'vitest'
import { mapRoles, onlyAdministratorRoles } from '~~/server/lib/lti/claims'
import { scoresUrl } from '~~/server/lib/lti/ags'
import { gradeRetryDelaySeconds } from '~~/server/lib/lti/grades'

// Role URIs: LTI Core 1.3 Appendix A.2
const M = 'http://purl.imsglobal.org/vocab/lis/v2/membership#'
const I = 'http://purl.imsglobal.org/vocab/lis/v2/institution/person#'
const S = 'http://purl.imsglobal.org/vocab/lis/v2/system/person#'

describe('mapping platform roles', () => {
  it('instructors (and teaching assistants) are tutors, learners students', () => {
    expect(mapRoles([`${M}Instructor`])).toBe('tutor')
    expect(mapRoles(['http://purl.imsglobal.org/vocab/lis/v2/membership/Instructor#TeachingAssistant'])).toBe('tutor')
    expect(mapRoles([`${M}Learner`])).toBe('student')
    expect(mapRoles([`${M}Learner`, `${M}Instructor`])).toBe('tutor')
  })
  it('never maps administrators, of the course, the institution or the system', () => {
    expect(mapRoles([`${M}Administrator`])).toBeNull()
    expect(mapRoles([`${S}Administrator`, `${I}Administrator`])).toBeNull()
    expect(onlyAdministratorRoles([`${S}Administrator`])).toBe(true)
    expect(onlyAdministratorRoles([`${S}Administrator`, `${M}Learner`])).toBe(false)
    expect(mapRoles([])).toBeNull()
  })
  it('uses institution roles only when the launch names no course role', () => {
    expect(mapRoles([`${I}Student`])).toBe('student')
    expect(mapRoles([`${I}Faculty`, `${M}Mentor`])).toBeNull()
  })
})

describe('score URL and retries', () => {
  it('appends /scores to the line item path and keeps its query (AGS 2.0 §3.4)', () => {
    expect(scoresUrl('https://platform.test/lineitems/7')).toBe('https://platform.test/lineitems/7/scores')
    expect(scoresUrl('https://platform.test/api/lineitems/7/?course=3')).toBe('https://platform.test/api/lineitems/7/scores?course=3')
  })
  it('waits longer each time, at most an hour (the mail rule)', () => {
    expect([1, 2, 3, 4].map(n => gradeRetryDelaySeconds(n, 30))).toEqual([30, 60, 120, 240])
    expect(gradeRetryDelaySeconds(20, 30)).toBe(3600)
  })
})
