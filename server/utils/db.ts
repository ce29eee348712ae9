import { drizzle, type NodePgDatabase } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from '../db/schema'

export { schema as tables }
export type Db = NodePgDatabase<typeof schema>
/** A transaction handle, for helpers that run inside a caller's transaction. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0]

let pool: pg.Pool | undefined
let db: Db | undefined

export function usePool(): pg.Pool {
  if (!pool) {
    // A database that does not answer fails a request in seconds (503), never holds it forever.
    // JIT off: it compiled a year's report for seconds before running it for less (short queries never gain).
    pool = new pg.Pool({ connectionString: useRuntimeConfig().databaseUrl, max: 10, connectionTimeoutMillis: 5000, options: '-c jit=off' })
    // An idle client's error (a restarted database) must not crash the server.
    pool.on('error', err => console.error('[db] idle client error', err.message))
  }
  return pool
}

export function useDb(): Db {
  if (!db) db = drizzle(usePool(), { schema })
  return db
}
