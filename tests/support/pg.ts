// The PostgreSQL test tier: with CYCLODIAL_TEST_PG_URL set (scripts/pg-cluster.sh
// start prints it), every server a test starts gets a fresh database of its own on
// that cluster, dropped again when the server stops.
import { randomBytes } from 'node:crypto'
import pg from 'pg'

export const testPgUrl = (): string | undefined => process.env.CYCLODIAL_TEST_PG_URL || undefined

export interface TestDatabase { url: string, name: string, drop: () => Promise<void> }

function withDatabase(url: string, name: string): string {
  const u = new URL(url)
  u.pathname = `/${name}`
  return u.toString()
}

async function admin<T>(adminUrl: string, work: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: adminUrl })
  await client.connect()
  try {
    return await work(client)
  }
  finally {
    await client.end()
  }
}

/** Creates an empty database on the cluster at `adminUrl`. */
export async function createTestDatabase(adminUrl: string): Promise<TestDatabase> {
  const name = `cyc_test_${randomBytes(6).toString('hex')}`
  await admin(adminUrl, c => c.query(`create database ${name}`))
  return {
    name,
    url: withDatabase(adminUrl, name),
    drop: async () => {
      await admin(adminUrl, c => c.query(`drop database if exists ${name} with (force)`))
    },
  }
}
