// The same migrations and the demo seed on SQLite and on PostgreSQL, and values
// that must come back identical from both: ISO times, JSON text, 0/1 flags,
// double-precision figures and counts. SQLite always runs; PostgreSQL runs when
// CYCLODIAL_TEST_PG_URL names a cluster (scripts/pg-cluster.sh start; CI's
// PostgreSQL tier sets it), each run in a fresh database of its own.
import type { Kysely } from 'kysely'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { migrateToLatest, openConfiguredDatabase, openDatabase, withStartupLock } from '../../../db/open'
import { dialectOf, groupConcat, greatestOf, isUniqueViolation, jsonNumber, jsonText, likeIgnoringCase } from '../../../db/dialect'
import type { Database } from '../../../db/schema'
import { migrations } from '../../../db/migrations'
import { seedDemoIfWanted } from '../../../db/seed'
import { createTestDatabase, testPgUrl, type TestDatabase } from '../../support/pg'

interface Target { name: 'sqlite' | 'postgres', db: Kysely<Database>, pgDb?: TestDatabase }
const targets: Target[] = []

// values chosen to break a careless mapping: sub-millisecond-free ISO time with a
// zone, JSON with unicode and nesting, a flag, and a figure float4 cannot hold
const TIME = '2026-03-29T01:30:00.123Z'
const JSON_TEXT = JSON.stringify({ readings: { RE: -3.5, LE: 0 }, words: 'ex­cyclo “near” ✓', list: [1, 2, 3], nil: null })
const FIGURE = 0.1 + 0.2 // 0.30000000000000004: exact only in an 8-byte double (IEEE 754)

beforeAll(async () => {
  targets.push({ name: 'sqlite', db: openDatabase(':memory:') })
  const adminUrl = testPgUrl()
  if (adminUrl) {
    const pgDb = await createTestDatabase(adminUrl)
    targets.push({ name: 'postgres', db: openConfiguredDatabase({ databaseUrl: pgDb.url, dbPath: '' }), pgDb })
  }
  for (const t of targets) {
    await withStartupLock(t.db, async (locked) => {
      await migrateToLatest(locked)
      expect(await seedDemoIfWanted(locked, { dev: false, flag: '1', hashPassword: async () => 'not-a-real-hash' })).toBe(true)
    })
  }
}, 180_000)

afterAll(async () => {
  for (const t of targets) {
    await t.db.destroy()
    await t.pgDb?.drop()
  }
})

async function roundTrip(db: Kysely<Database>) {
  const user = await db.insertInto('users').values({
    email: `rt-${dialectOf(db)}@example.test`, name: 'Round Trip', role: 'student', password_hash: 'x',
    disabled: 1, created_at: TIME, updated_at: TIME, last_login_at: null,
  }).returning('id').executeTakeFirstOrThrow()
  const photo = await db.insertInto('fundus_photos').values({
    owner_id: user.id, title: 'rt', eye: 'RE', notes: JSON_TEXT, storage_name: `rt-${dialectOf(db)}.jpg`, mime: 'image/jpeg',
    byte_size: 1, width: 1, height: 1, disc_x: FIGURE, disc_y: -1e-9, fovea_x: 123456.789012345, fovea_y: null,
    reference_angle: -6.26, marked_at: TIME, created_at: TIME, updated_at: TIME,
  }).returning('id').executeTakeFirstOrThrow()
  const u = await db.selectFrom('users').select(['disabled', 'created_at', 'last_login_at']).where('id', '=', user.id).executeTakeFirstOrThrow()
  const p = await db.selectFrom('fundus_photos').select(['notes', 'disc_x', 'disc_y', 'fovea_x', 'fovea_y', 'reference_angle', 'marked_at'])
    .where('id', '=', photo.id).executeTakeFirstOrThrow()
  const { n } = await db.selectFrom('users').select(eb => eb.fn.countAll<number>().as('n')).where('disabled', '=', 1).executeTakeFirstOrThrow()
  const { mean } = await db.selectFrom('users').select(eb => eb.fn.avg<number>('disabled').as('mean')).where('id', '=', user.id).executeTakeFirstOrThrow()
  const later = await db.selectFrom('users').select('id').where('created_at', '>', '2026-03-29T01:29:59.999Z').where('id', '=', user.id).execute()
  return { u, p, n, mean, later: later.length, parsed: JSON.parse(p.notes!) }
}

describe('one schema on every configured database', () => {
  it('runs on the dialects configured here', () => {
    expect(targets.map(t => t.name)).toContain('sqlite')
    if (testPgUrl()) expect(targets.map(t => t.name)).toEqual(['sqlite', 'postgres'])
    for (const t of targets) expect(dialectOf(t.db)).toBe(t.name)
  })

  it('applies every migration and seeds the same demo school', async () => {
    const shapes = []
    for (const t of targets) {
      const applied = await t.db.selectFrom('kysely_migration' as never).select('name' as never).execute() as { name: string }[]
      expect(applied.map(r => r.name).sort()).toEqual(Object.keys(migrations).sort())
      const count = async (table: keyof Database) => Number((await t.db.selectFrom(table).select(eb => eb.fn.countAll<number>().as('n')).executeTakeFirstOrThrow()).n)
      shapes.push({ users: await count('users'), cohorts: await count('cohorts'), quizzes: await count('quizzes'), attempts: await count('attempts') })
    }
    expect(shapes[0]!.attempts).toBeGreaterThan(200)
    for (const s of shapes) expect(s).toEqual(shapes[0])
  })

  it('gives back times, JSON, flags, figures and counts exactly as stored, the same on each', async () => {
    const results = []
    for (const t of targets) {
      const r = await roundTrip(t.db)
      expect(r.u).toEqual({ disabled: 1, created_at: TIME, last_login_at: null })
      expect(typeof r.u.disabled).toBe('number')
      expect(r.p).toEqual({ notes: JSON_TEXT, disc_x: FIGURE, disc_y: -1e-9, fovea_x: 123456.789012345, fovea_y: null, reference_angle: -6.26, marked_at: TIME })
      expect(r.parsed.words).toBe('ex­cyclo “near” ✓')
      expect(typeof r.n).toBe('number')
      expect(r.mean).toBe(1)
      expect(r.later).toBe(1)
      results.push(r)
    }
    for (const r of results) expect(r).toEqual(results[0])
  })

  it('numbers new rows itself after the seed (the id sequence is not behind)', async () => {
    for (const t of targets) {
      const { top } = await t.db.selectFrom('cohorts').select(eb => eb.fn.max('id').as('top')).executeTakeFirstOrThrow()
      const row = await t.db.insertInto('cohorts').values({ name: `After seed ${t.name}`, created_at: TIME, updated_at: TIME }).returning('id').executeTakeFirstOrThrow()
      expect(row.id).toBeGreaterThan(Number(top))
    }
  })

  it('reports a duplicate as a unique violation, and upserts the same way', async () => {
    for (const t of targets) {
      const email = `dup-${t.name}@example.test`
      const values = { email, name: 'Dup', role: 'student' as const, password_hash: 'x', disabled: 0 as const, created_at: TIME, updated_at: TIME, last_login_at: null }
      await t.db.insertInto('users').values(values).execute()
      const error = await t.db.insertInto('users').values(values).execute().then(() => null, (e: unknown) => e)
      expect(isUniqueViolation(error)).toBe(true)
      await t.db.insertInto('users').values({ ...values, name: 'Dup again' })
        .onConflict(oc => oc.column('email').doUpdateSet({ name: eb => eb.ref('excluded.name') })).execute()
      const row = await t.db.selectFrom('users').select('name').where('email', '=', email).executeTakeFirstOrThrow()
      expect(row.name).toBe('Dup again')
    }
  })

  it('matches text ignoring case, joins a group, takes the larger of two and reads inside JSON, the same on each', async () => {
    const out = []
    for (const t of targets) {
      const like = await t.db.selectFrom('users').select('email').where(likeIgnoringCase(t.db, 'email', 'RT-%@EXAMPLE.TEST')).execute()
      const joined = await t.db.selectFrom('users').select(groupConcat(t.db, 'name', '|').as('names')).where('email', 'like', 'dup-%').executeTakeFirstOrThrow()
      const bigger = await t.db.selectFrom('fundus_photos').select(greatestOf(t.db, 'disc_x', 'reference_angle').as('g')).where('title', '=', 'rt').executeTakeFirstOrThrow()
      const json = await t.db.selectFrom('fundus_photos')
        .select([jsonText(t.db, 'notes', '$.words').as('words'), jsonNumber(t.db, 'notes', '$.readings.RE').as('re'), jsonNumber(t.db, 'notes', '$.list[2]').as('third'), jsonText(t.db, 'notes', '$.missing').as('missing')])
        .where('title', '=', 'rt').where(jsonNumber(t.db, 'notes', '$.list[0]'), '=', 1).executeTakeFirstOrThrow()
      out.push({ like: like.length, joined: joined.names, bigger: bigger.g, json })
    }
    expect(out[0]).toEqual({ like: 1, joined: 'Dup again', bigger: FIGURE, json: { words: 'ex­cyclo “near” ✓', re: -3.5, third: 3, missing: null } })
    for (const o of out) expect(o).toEqual(out[0])
  })
})
