// The static migration list (a bundled server cannot read the folder) holds every
// file in db/migrations, in name order: the migrator runs them in that order only.
import { readdirSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { Kysely, Migrator, SqliteDialect } from 'kysely'
import Database from 'better-sqlite3'
import { describe, expect, it } from 'vitest'
import { migrations, staticMigrationProvider } from '~~/db/migrations'
import { migrateToLatest, settleEarlierRunOrder } from '~~/db/open'

const folder = fileURLToPath(new URL('../../../db/migrations/', import.meta.url))

describe('migration list', () => {
  it('names every migration file once, sorted', () => {
    const files = readdirSync(folder).filter(f => /^\d{4}_\w+\.ts$/.test(f)).map(f => f.replace(/\.ts$/, ''))
    const names = Object.keys(migrations)
    expect(names).toEqual([...files].sort())
    expect(names).toEqual([...names].sort())
  })

  it('refuses a database whose migrations ran out of name order', async () => {
    const db = new Kysely<any>({ dialect: new SqliteDialect({ database: new Database(':memory:') }) })
    const [first, second, third] = Object.keys(migrations)
    const only = (names: string[]) => ({ getMigrations: async () => Object.fromEntries(names.map(n => [n, migrations[n]!])) })
    expect((await new Migrator({ db, provider: only([first!, third!]) }).migrateToLatest()).error).toBeUndefined()
    const { error } = await new Migrator({ db, provider: staticMigrationProvider, allowUnorderedMigrations: false }).migrateToLatest()
    expect(String(error)).toMatch(new RegExp(second!))
    await db.destroy()
  })

  it('upgrades a database made while the list ran 0003 after 0004–0007, and leaves a gap refused', async () => {
    const db = new Kysely<any>({ dialect: new SqliteDialect({ database: new Database(':memory:') }) })
    // the order such databases ran in: 0003 was added to the list after 0004–0007
    const names = Object.keys(migrations)
    const earlier = names.filter(n => n !== '0003_quizzes' && n <= '0007_review_learners')
    const upTo = (list: string[]) => ({ getMigrations: async () => Object.fromEntries(list.map(n => [n, migrations[n]!])) })
    expect((await new Migrator({ db, provider: upTo(earlier) }).migrateToLatest()).error).toBeUndefined()
    await new Promise(r => setTimeout(r, 5))
    expect((await new Migrator({ db, provider: upTo([...earlier, '0003_quizzes']), allowUnorderedMigrations: true }).migrateToLatest()).error).toBeUndefined()
    // the strict migrator alone calls this record corrupted
    const strict = await new Migrator({ db, provider: staticMigrationProvider, allowUnorderedMigrations: false }).migrateToLatest()
    expect(String(strict.error)).toMatch(/corrupted migrations/)
    // restamped in name order, the rest of the list runs on top
    const ran = await migrateToLatest(db)
    expect(ran.map(r => r.name)).toEqual(names.filter(n => n > '0007_review_learners'))
    expect(await settleEarlierRunOrder(db)).toBe(false)
    await db.destroy()
  })
})
