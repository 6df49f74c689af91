// The tool's own signing keys (RS256, RFC 7518 §3.3): generated with jose on first use,
// stored in lti_tool_keys with a kid, published at /api/lti/jwks (RFC 7517 §5).
// Rotation: rotateToolKey() adds a new key that signs from then on; the older keys stay
// published (platforms cache key sets) until retireToolKeys() removes them.
import { randomUUID } from 'node:crypto'
import { exportJWK, generateKeyPair, importJWK, type JWK } from 'jose'
import type { Kysely } from 'kysely'
import type { Database } from '~~/db/schema'

export const TOOL_ALG = 'RS256' // LTI Security Framework 1.0 §6.1: RS256 is the algorithm platforms and tools must support

export interface ToolKey { kid: string, alg: string, key: CryptoKey }

let creating: Promise<void> | null = null

async function createKey(db: Kysely<Database>): Promise<void> {
  const { publicKey, privateKey } = await generateKeyPair(TOOL_ALG, { extractable: true, modulusLength: 2048 })
  const kid = randomUUID()
  const pub = { ...await exportJWK(publicKey), kid, alg: TOOL_ALG, use: 'sig' }
  const priv = { ...await exportJWK(privateKey), kid, alg: TOOL_ALG }
  await db.insertInto('lti_tool_keys').values({
    kid,
    alg: TOOL_ALG,
    public_jwk: JSON.stringify(pub),
    private_jwk: JSON.stringify(priv),
    active: 1,
    created_at: new Date().toISOString(),
  }).execute()
}

/** Makes sure a signing key exists (called at start-up and before signing). */
export async function ensureToolKey(db: Kysely<Database>): Promise<void> {
  const any = await db.selectFrom('lti_tool_keys').select('kid').where('active', '=', 1).limit(1).executeTakeFirst()
  if (any) return
  creating ??= createKey(db).finally(() => {
    creating = null
  })
  await creating
}

const imported = new Map<string, CryptoKey>()

/** The newest active key, for signing. */
export async function toolSigningKey(db: Kysely<Database>): Promise<ToolKey> {
  await ensureToolKey(db)
  const row = await db.selectFrom('lti_tool_keys').selectAll().where('active', '=', 1).orderBy('created_at', 'desc').orderBy('kid').limit(1).executeTakeFirstOrThrow()
  let key = imported.get(row.kid)
  if (!key) {
    key = await importJWK(JSON.parse(row.private_jwk) as JWK, row.alg) as CryptoKey
    imported.set(row.kid, key)
  }
  return { kid: row.kid, alg: row.alg, key }
}

/** The public key set (every stored key, so signatures made before a rotation still verify). */
export async function toolJwks(db: Kysely<Database>): Promise<{ keys: JWK[] }> {
  await ensureToolKey(db)
  const rows = await db.selectFrom('lti_tool_keys').select('public_jwk').orderBy('created_at', 'desc').execute()
  return { keys: rows.map(r => JSON.parse(r.public_jwk) as JWK) }
}

/** Adds a new signing key; the older ones stop signing but stay published. */
export async function rotateToolKey(db: Kysely<Database>): Promise<string> {
  await db.updateTable('lti_tool_keys').set({ active: 0 }).execute()
  await createKey(db)
  return (await toolSigningKey(db)).kid
}

/** Removes keys that no longer sign and were made before `before` (ISO time). */
export async function retireToolKeys(db: Kysely<Database>, before: string): Promise<number> {
  const result = await db.deleteFrom('lti_tool_keys').where('active', '=', 0).where('created_at', '<', before).executeTakeFirst()
  for (const kid of [...imported.keys()]) imported.delete(kid)
  return Number(result.numDeletedRows)
}
