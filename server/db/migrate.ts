// Applies the committed drizzle-kit migrations; run by `npm start`, `npm test` and `npm run dev`.
import { fileURLToPath } from 'node:url'
import { drizzle } from 'drizzle-orm/node-postgres'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import pg from 'pg'

const url = process.env.NUXT_DATABASE_URL ?? 'postgres://wayside@127.0.0.1:54329/wayside'
const pool = new pg.Pool({ connectionString: url, max: 1 })
try {
  await migrate(drizzle(pool), { migrationsFolder: fileURLToPath(new URL('./migrations', import.meta.url)) })
  console.log('[wayside] migrations applied')
}
finally {
  await pool.end()
}
