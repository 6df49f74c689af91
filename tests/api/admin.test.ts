import { describe, expect, inject, it } from 'vitest'
import { Client, DEMO, signedIn } from '../support/client'

const baseURL = inject('baseURL')

describe('admin: users', () => {
  it('searches, filters, sorts and paginates', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const students = await admin.get('/api/admin/users?role=student&pageSize=5&sort=name&dir=asc')
    expect(students.status).toBe(200)
    expect(students.body.total).toBeGreaterThanOrEqual(12)
    expect(students.body.items).toHaveLength(5)
    const names = students.body.items.map((u: { name: string }) => u.name)
    expect(names).toEqual([...names].sort())

    const page2 = await admin.get('/api/admin/users?role=student&pageSize=5&page=2&sort=name&dir=asc')
    expect(page2.body.items[0].name).not.toBe(names[0])

    const desc = await admin.get('/api/admin/users?role=student&pageSize=100&sort=email&dir=desc')
    const emails = desc.body.items.map((u: { email: string }) => u.email)
    expect(emails).toEqual([...emails].sort().reverse())

    const search = await admin.get('/api/admin/users?q=arkwell')
    expect(search.body.items.map((u: { email: string }) => u.email)).toEqual([DEMO.student])

    const bad = await admin.get('/api/admin/users?sort=password_hash&page=0')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.map((f: { path: string }) => f.path)).toEqual(expect.arrayContaining(['sort', 'page']))
  })

  it('changes a role, disables and enables, with an audit trail', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const target = (await admin.get('/api/admin/users?q=rafe.tolliver')).body.items[0]
    const asTarget = await signedIn(baseURL, 'rafe.tolliver@cyclodial.test')

    const promoted = await admin.patch(`/api/admin/users/${target.id}`, { role: 'tutor' })
    expect(promoted.status).toBe(200)
    expect(promoted.body.role).toBe('tutor')
    // A role change ends the person's sessions at once (issue 12); signing in again
    // gives the new role.
    expect((await asTarget.get('/api/auth/me')).status).toBe(401)
    expect((await signedIn(baseURL, 'rafe.tolliver@cyclodial.test').then(c => c.get('/api/auth/me'))).body.user.role).toBe('tutor')
    await admin.patch(`/api/admin/users/${target.id}`, { role: 'student' })

    const again = await signedIn(baseURL, 'rafe.tolliver@cyclodial.test')
    expect((await again.get('/api/auth/me')).status).toBe(200)
    const disabled = await admin.patch(`/api/admin/users/${target.id}`, { disabled: true })
    expect(disabled.body.disabled).toBe(true)
    expect((await again.get('/api/auth/me')).status).toBe(401)
    expect((await new Client(baseURL).post('/api/auth/login', { email: 'rafe.tolliver@cyclodial.test', password: 'cyclodial-demo' })).status).toBe(401)
    await admin.patch(`/api/admin/users/${target.id}`, { disabled: false })
    expect((await new Client(baseURL).post('/api/auth/login', { email: 'rafe.tolliver@cyclodial.test', password: 'cyclodial-demo' })).status).toBe(200)

    const audit = (await admin.get('/api/admin/audit?pageSize=100')).body.items
    const mine = audit.filter((e: { target: string }) => e.target === `user ${target.id}`).map((e: { action: string }) => e.action)
    expect(mine).toEqual(expect.arrayContaining(['user.role-changed', 'user.disabled-changed']))
  })

  it('will not let an admin lock themselves out', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const me = (await admin.get('/api/auth/me')).body.user
    const r = await admin.patch(`/api/admin/users/${me.id}`, { disabled: true })
    expect(r.status).toBe(409)
    expect((await admin.patch(`/api/admin/users/${me.id}`, { role: 'student' })).status).toBe(409)
  })

  it('moves a student between cohorts, one cohort at most', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const cohorts = (await admin.get('/api/admin/cohorts')).body.items as { id: number, name: string }[]
    const heron = cohorts.find(c => c.name === 'Heron cohort')!
    const kestrel = cohorts.find(c => c.name === 'Kestrel cohort')!
    const student = (await admin.get('/api/admin/users?q=priya')).body.items[0]
    expect(student.cohorts.map((c: { id: number }) => c.id)).toEqual([kestrel.id])

    const moved = await admin.patch(`/api/admin/users/${student.id}`, { cohortIds: [heron.id] })
    expect(moved.body.cohorts.map((c: { id: number }) => c.id)).toEqual([heron.id])
    const two = await admin.patch(`/api/admin/users/${student.id}`, { cohortIds: [heron.id, kestrel.id] })
    expect(two.status).toBe(400)
    expect(two.body.data.fields[0].path).toBe('cohortIds')
    await admin.patch(`/api/admin/users/${student.id}`, { cohortIds: [kestrel.id] })

    const empty = await admin.patch(`/api/admin/users/${student.id}`, {})
    expect(empty.status).toBe(400)
    expect((await admin.patch('/api/admin/users/999999', { name: 'Ghost' })).status).toBe(404)
    expect((await admin.patch('/api/admin/users/abc', { name: 'Ghost' })).status).toBe(400)
  })
})

describe('admin: cohorts', () => {
  it('creates and renames cohorts, refusing duplicate names', async () => {
    const admin = await signedIn(baseURL, DEMO.admin)
    const created = await admin.post('/api/admin/cohorts', { name: 'Osprey cohort' })
    expect(created.status).toBe(201)
    expect((await admin.post('/api/admin/cohorts', { name: 'osprey COHORT' })).status).toBe(409)
    expect((await admin.post('/api/admin/cohorts', { name: ' ' })).status).toBe(400)

    const renamed = await admin.patch(`/api/admin/cohorts/${created.body.id}`, { name: 'Osprey cohort 2027' })
    expect(renamed.status).toBe(200)
    const list = (await admin.get('/api/admin/cohorts')).body.items.map((c: { name: string }) => c.name)
    expect(list).toContain('Osprey cohort 2027')
    expect(list).not.toContain('Osprey cohort')
    expect((await admin.patch(`/api/admin/cohorts/${created.body.id}`, { name: 'Heron cohort' })).status).toBe(409)

    const audit = (await admin.get('/api/admin/audit?pageSize=100')).body.items.map((e: { action: string }) => e.action)
    expect(audit).toEqual(expect.arrayContaining(['cohort.created', 'cohort.renamed']))
  })
})
