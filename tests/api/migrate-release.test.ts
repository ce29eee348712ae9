import { execFileSync } from 'node:child_process'
import { readFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DATABASE_URL } from '../support/env'

// A business's data outlives every release. tests/fixtures/release-0.1.sql is a pg_dump of the demo
// database as release 0.1 left it (its schema, its drizzle migration log, every row); this test
// loads it into a database of its own, runs today's migrations over it and finds every row again.
const FIXTURE = fileURLToPath(new URL('../fixtures/release-0.1.sql', import.meta.url))
const scratchName = `wayside_release_${process.pid}`
const adminUrl = DATABASE_URL.replace(/\/[^/]+$/, '/postgres')
const scratchUrl = DATABASE_URL.replace(/\/[^/]+$/, `/${scratchName}`)
const psql = `${process.env.WAYSIDE_PG_BIN ?? '/usr/bin'}/psql`

/** Table → the first column (the key) of every row the dump holds. */
function rowsInDump(sql: string): Map<string, string[]> {
  const out = new Map<string, string[]>()
  const lines = sql.split('\n')
  for (let i = 0; i < lines.length; i++) {
    const m = /^COPY public\.(\w+) \((\w+)/.exec(lines[i]!)
    if (!m) continue
    const keys: string[] = []
    for (i++; i < lines.length && lines[i] !== '\\.'; i++) keys.push(lines[i]!.split('\t')[0]!)
    out.set(`${m[1]}.${m[2]}`, keys)
  }
  return out
}

describe('a database filled at the previous release', () => {
  const admin = new pg.Client({ connectionString: adminUrl })
  beforeAll(async () => {
    await admin.connect()
    await admin.query(`DROP DATABASE IF EXISTS ${scratchName} WITH (FORCE)`)
    await admin.query(`CREATE DATABASE ${scratchName}`)
  })
  afterAll(async () => {
    await admin.query(`DROP DATABASE IF EXISTS ${scratchName} WITH (FORCE)`)
    await admin.end()
  })

  it('migrates to this release and keeps every record', async () => {
    const dump = readFileSync(FIXTURE, 'utf8')
    const before = rowsInDump(dump)
    expect(before.get('calls.id')?.length).toBeGreaterThan(10)
    execFileSync(psql, ['-q', '-v', 'ON_ERROR_STOP=1', '-d', scratchUrl, '-f', FIXTURE], { stdio: 'pipe' })
    execFileSync('npx', ['tsx', 'server/db/migrate.ts'], { env: { ...process.env, NUXT_DATABASE_URL: scratchUrl }, stdio: 'pipe' })

    const client = new pg.Client({ connectionString: scratchUrl })
    await client.connect()
    try {
      for (const [key, ids] of before) {
        const [table, column] = key.split('.') as [string, string]
        const { rows } = await client.query(`SELECT ${column}::text AS k FROM ${table}`)
        const now = new Set(rows.map(r => r.k as string))
        const missing = ids.filter(id => !now.has(id))
        expect(missing, `${table}: rows lost by the migration`).toEqual([])
      }
    }
    finally { await client.end() }
  })
})
