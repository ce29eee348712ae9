// On a history of a busy shop, every list and report reads calls and readings through an index.
// A smaller copy of the scale seed (server/db/seed/scaleSql.ts) goes into a database of its own,
// VACUUM ANALYZE gives the planner its sizes, and each query the routes run is EXPLAINed: a
// sequential scan of calls or readings fails the test. The queries come from the same builders the
// routes use, so a change to a route's SQL is what gets checked.
import { fileURLToPath } from 'node:url'
import { drizzle } from 'drizzle-orm/node-postgres'
import { migrate } from 'drizzle-orm/node-postgres/migrator'
import { PgDialect } from 'drizzle-orm/pg-core'
import type { SQL } from 'drizzle-orm'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/db/schema'
import { loadScale, scaleId, type ScaleSize } from '../../server/db/seed/scaleSql'
import { seedId } from '../../server/db/seed/ids'
import { callListQueries } from '../../server/utils/callList'
import { unitHistoryQuery } from '../../server/utils/vehicles'
import { comebackCallsSql, mechanicWeeksSql, reportSql } from '../../server/utils/reports'
import { firstPullQueries } from '../../server/utils/sync/pull'
import { callListQuerySchema } from '../../shared/schemas/calls'
import { DATABASE_URL } from '../support/env'

const NAME = `${DATABASE_URL.replace(/^.*\//, '')}_plans`
const adminUrl = DATABASE_URL.replace(/\/[^/]+$/, '/postgres')
const url = DATABASE_URL.replace(/\/[^/]+$/, `/${NAME}`)
/**
 * A fifth of the full seed's calls over eight years: a long history, where a year is an eighth of
 * it, and enough rows that the planner weighs an index against a scan as it would at full size.
 */
const SIZE: ScaleSize = { calls: 20_000, units: 1_000, customers: 100, mechanics: 5, days: 8 * 365 }
const WATCHED = new Set(['calls', 'readings'])

let pool: pg.Pool
let db: ReturnType<typeof drizzle<typeof schema>>
const dialect = new PgDialect()
const office = { id: seedId('user:office'), role: 'office' } as const

type PlanNode = { 'Node Type': string, 'Relation Name'?: string, 'Plans'?: PlanNode[] }
function scans(node: PlanNode, out: string[] = []) {
  if (node['Node Type'] === 'Seq Scan' && node['Relation Name']) out.push(node['Relation Name'])
  for (const child of node.Plans ?? []) scans(child, out)
  return out
}

/** The tables among calls and readings a query reads by a sequential scan, with the plan to show when there are any. */
async function seqScans(query: { sql: string, params: unknown[] }) {
  const { rows } = await pool.query(`EXPLAIN (FORMAT JSON) ${query.sql}`, query.params)
  const plan = (rows[0]['QUERY PLAN'] as { Plan: PlanNode }[])[0]!.Plan
  const found = scans(plan).filter(t => WATCHED.has(t))
  if (!found.length) return found
  const text = await pool.query(`EXPLAIN ${query.sql}`, query.params)
  return [...found, text.rows.map(r => r['QUERY PLAN']).join('\n')]
}
const ofSql = (s: SQL) => dialect.sqlToQuery(s)
const list = (q: Record<string, string>) => callListQuerySchema.parse(q)

beforeAll(async () => {
  const admin = new pg.Client({ connectionString: adminUrl })
  await admin.connect()
  await admin.query(`DROP DATABASE IF EXISTS ${NAME} WITH (FORCE)`)
  await admin.query(`CREATE DATABASE ${NAME}`)
  await admin.end()
  pool = new pg.Pool({ connectionString: url, max: 2 })
  db = drizzle(pool, { schema })
  await migrate(drizzle(pool), { migrationsFolder: fileURLToPath(new URL('../../server/db/migrations', import.meta.url)) })
  const client = await pool.connect()
  try {
    await loadScale(client, SIZE)
    await client.query('VACUUM ANALYZE')
  }
  finally { client.release() }
}, 240_000)

afterAll(async () => {
  await pool?.end()
  if (process.env.WAYSIDE_KEEP_PLANS_DB) return
  const admin = new pg.Client({ connectionString: adminUrl })
  await admin.connect()
  await admin.query(`DROP DATABASE IF EXISTS ${NAME} WITH (FORCE)`)
  await admin.end()
})

describe('on a long history, lists and reports stay on indexes', () => {
  it('the calls list: first page, a status filter, a text search, a deep page and a cursor', async () => {
    const cases: [string, Record<string, string>][] = [
      ['first page', {}],
      ['status filter', { status: 'invoiced' }],
      ['open calls', { open: 'true' }],
      ['search a customer', { q: 'Ironwood' }],
      ['search a complaint', { q: 'derate' }],
      ['search a unit', { q: 'S00042' }],
      ['search a call number', { q: '1234' }],
      ['page 400', { page: '400' }],
      ['sorted by status, page 100', { sort: 'status', dir: 'asc', page: '100' }],
    ]
    for (const [what, q] of cases) {
      const { ids, page, count } = await callListQueries(db, office, list(q))
      expect(await seqScans(ids.toSQL()), `${what}: ids`).toEqual([])
      expect(await seqScans(page.toSQL()), `${what}: page`).toEqual([])
      expect(await seqScans(count.toSQL()), `${what}: count`).toEqual([])
    }
    const first = await callListQueries(db, office, list({}))
    const [last] = (await first.page).slice(-1)
    const cursor = Buffer.from(JSON.stringify([last!.key, last!.call.number])).toString('base64url')
    const after = await callListQueries(db, office, list({ after: cursor }))
    expect(await seqScans(after.page.toSQL()), 'after a cursor').toEqual([])
  })

  it('a unit\'s history, first page and older', async () => {
    const { rows: [u] } = await pool.query(`SELECT ${scaleId('unit', '7')} AS id`)
    for (const cursor of [undefined, ['2025-01-01T00:00:00.000Z', 99999] as [string, number]]) {
      expect(await seqScans(unitHistoryQuery(db, u.id, undefined, cursor).toSQL())).toEqual([])
    }
  })

  it('every report over one year', async () => {
    const r = { from: '2025-01-01', to: '2025-12-31', zone: 'America/Chicago' }
    for (const name of ['calls-per-day', 'response-times', 'fix-rate', 'revenue', 'parts'] as const) {
      expect(await seqScans(ofSql(reportSql(name, r))), name).toEqual([])
    }
    expect(await seqScans(ofSql(comebackCallsSql(r, 31, 31))), 'comebacks').toEqual([])
    expect(await seqScans(ofSql(mechanicWeeksSql(r, '{}'))), 'mechanic-weeks').toEqual([])
  })

  it('a mechanic\'s first pull: every collection of the working set', async () => {
    const { rows: [m] } = await pool.query(`SELECT ${scaleId('mech', '1')} AS id`)
    for (const [key, query] of await firstPullQueries(db, { id: m.id, role: 'mechanic' } as never, 30, 500)) {
      expect(await seqScans(query), key).toEqual([])
    }
  })
})
