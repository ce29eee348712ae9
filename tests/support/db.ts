import pg from 'pg'
import { DATABASE_URL } from './env'

let pool: pg.Pool | undefined
/** Direct access to the test database, for checks the API does not show (row counts). */
export function testPool() {
  pool ??= new pg.Pool({ connectionString: DATABASE_URL, max: 4 })
  return pool
}
export async function count(table: string, where = 'true', params: unknown[] = []) {
  const r = await testPool().query(`SELECT count(*)::int AS n FROM ${table} WHERE ${where}`, params)
  return r.rows[0].n as number
}
export async function closeTestPool() {
  await pool?.end()
  pool = undefined
}
