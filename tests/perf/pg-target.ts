// Which PostgreSQL cluster the benchmarks also measure: CYCLODIAL_TEST_PG_URL when set,
// else a cluster started by `bash scripts/pg-cluster.sh start` that still answers
// (its port is kept in $PG_CLUSTER_DIR/port, default /tmp/cyclodial-pg/port).
// Undefined when neither: the benchmarks then measure SQLite only and say so.
import { existsSync, readFileSync } from 'node:fs'
import { join } from 'node:path'
import pg from 'pg'
import { testPgUrl } from '../support/pg'

export async function benchPgUrl(): Promise<string | undefined> {
  const fromEnv = testPgUrl()
  if (fromEnv) return fromEnv
  const state = join(process.env.PG_CLUSTER_DIR || '/tmp/cyclodial-pg', 'port')
  if (!existsSync(state)) return undefined
  const port = Number(readFileSync(state, 'utf8').trim())
  if (!Number.isInteger(port) || port <= 0) return undefined
  // the same URL scripts/pg-cluster.sh prints
  const url = `postgres://postgres@127.0.0.1:${port}/postgres`
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 2000 })
  try {
    await client.connect()
    await client.query('select 1')
    return url
  }
  catch {
    return undefined
  }
  finally {
    await client.end().catch(() => {})
  }
}
