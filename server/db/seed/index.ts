// Seeds the demo once; every insert skips rows that already exist, so running it again is safe.
import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import * as schema from '../schema'
import { seedBilling } from './billing'
import { seedCore } from './core'
import { seedCards } from './cards'

const url = process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside'
const pool = new pg.Pool({ connectionString: url, max: 2 })
const db = drizzle(pool, { schema })
try {
  await db.transaction(async (tx) => {
    await seedCore(tx as unknown as typeof db)
    await seedCards(tx as unknown as typeof db)
    await seedBilling(tx as unknown as typeof db)
  })
  console.log('[wayside] demo data in place')
}
finally {
  await pool.end()
}
