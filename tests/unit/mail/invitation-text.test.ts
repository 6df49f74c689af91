import { describe, expect, it } from 'vitest'
import { invitationText } from '~~/server/lib/mail/invitation-text'

const link = 'http://127.0.0.1:3000/invite/abc'

describe('the invitation e-mail', () => {
  it('greets the person by name when the inviter gave one', () => {
    const text = invitationText({ name: 'Ilse Marrow', role: 'student', cohortName: 'Year 2 cohort', link })
    expect(text.split('\n')[0]).toBe('Hello Ilse Marrow,')
    expect(text).toContain('as a student in the Year 2 cohort')
    expect(text).toContain(link)
  })

  it('says a plain hello without a name', () => {
    for (const name of [undefined, null, '', '  ']) {
      expect(invitationText({ name, role: 'tutor', link }).split('\n')[0]).toBe('Hello,')
    }
  })
})
