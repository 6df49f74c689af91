import { describe, expect, it } from 'vitest'
import { ROSTER_MAX_BYTES, RosterFileError, checkRoster, rosterText } from '~~/server/lib/roster/roster'

const ctx = {
  cohorts: [{ id: 1, name: 'Kestrel cohort' }, { id: 2, name: 'Heron cohort' }],
  assignable: [1],
  defaultCohortId: null as number | null,
  existingEmails: new Set(['taken@cyclodial.test']),
}
const file = (text: string, type = 'text/csv') => ({ filename: 'r.csv', type, data: Buffer.from(text, 'utf8') })

describe('roster files', () => {
  it('reports each row with its own problems, by line', () => {
    const report = checkRoster([
      'Name,E-mail,Cohort',
      'Ada Pell,ada.pell@cyclodial.test,Kestrel cohort',
      'Bo Rane,not-an-email,Kestrel cohort',
      'Cy Doe,ada.pell@cyclodial.test,kestrel COHORT',
      'Di Fenn,di.fenn@cyclodial.test,Osprey cohort',
      'Ed Gale,ed.gale@cyclodial.test,Heron cohort',
      'Fa Hume,taken@cyclodial.test,Kestrel cohort',
      ',gi@cyclodial.test,',
      '',
    ].join('\n'), ctx)
    expect(report.total).toBe(7)
    expect(report.canImport).toBe(false)
    const byLine = Object.fromEntries(report.rows.map(r => [r.line, r.problems.join(' ')]))
    expect(byLine[2]).toBe('')
    expect(byLine[3]).toMatch(/not a valid e-mail/)
    expect(byLine[4]).toMatch(/Duplicate: .* line 2/)
    expect(byLine[5]).toMatch(/Unknown cohort “Osprey cohort”/)
    expect(byLine[6]).toMatch(/do not teach/)
    expect(byLine[7]).toMatch(/already has a Cyclodial account/)
    expect(byLine[8]).toMatch(/Name is missing.*No cohort/)
    expect(report.rows[0]!.cohort).toEqual({ id: 1, name: 'Kestrel cohort' })
  })

  it('puts rows without a cohort into the chosen cohort, and reads quoted fields', () => {
    const report = checkRoster('email,name\n"o.quill@cyclodial.test","Quill, Orla"\n', { ...ctx, defaultCohortId: 1 })
    expect(report.canImport).toBe(true)
    expect(report.rows[0]).toMatchObject({ line: 2, name: 'Quill, Orla', email: 'o.quill@cyclodial.test', cohort: { id: 1 } })
  })

  it('refuses files that are not CSV text, too large, or without a header', () => {
    const problem = (f: () => unknown) => {
      try {
        f()
      }
      catch (e) {
        return e instanceof RosterFileError ? `${e.status} ${e.code}` : String(e)
      }
      return 'no error'
    }
    expect(problem(() => rosterText(file('a,b', 'image/png')))).toBe('415 not-csv')
    expect(problem(() => rosterText({ type: 'text/csv', data: Buffer.from([0x89, 0x50, 0x4E, 0x47, 0x0D, 0x0A, 0x1A, 0x0A, 0x00]) }))).toBe('415 not-text')
    expect(problem(() => rosterText({ type: 'text/csv', data: Buffer.from([0xFF, 0xFE, 0x41]) }))).toBe('415 not-text')
    expect(problem(() => rosterText({ type: 'text/csv', data: Buffer.alloc(ROSTER_MAX_BYTES + 1, 0x61) }))).toBe('413 file-too-large')
    expect(problem(() => checkRoster('first,second\nx,y\n', ctx))).toBe('400 roster-header')
    expect(rosterText(file('\uFEFFname,email\n', 'text/csv; charset=utf-8'))).toBe('name,email\n')
  })
})
