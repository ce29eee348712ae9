// npm run db:backup and npm run db:restore: a backup of the test database restored into an empty
// database holds every record; a database with tables is not overwritten unless --clean is given.
import { execFileSync, spawnSync } from 'node:child_process'
import { existsSync, mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DATABASE_URL } from '../support/env'

const ROOT = fileURLToPath(new URL('../..', import.meta.url))
const scratch = `wayside_restore_${process.pid}`
const scratchUrl = DATABASE_URL.replace(/\/[^/]+$/, `/${scratch}`)
const adminUrl = DATABASE_URL.replace(/\/[^/]+$/, '/postgres')
const dir = mkdtempSync(join(tmpdir(), 'wayside-backup-'))

const npm = (args: string[], url: string) => spawnSync('npm', ['run', '-s', ...args], {
  cwd: ROOT, env: { ...process.env, NUXT_DATABASE_URL: url, WAYSIDE_BACKUP_DIR: dir }, encoding: 'utf8', timeout: 120_000,
})

/** Every table of the app (public and drizzle's), with each row's text, sorted: a full fingerprint. */
async function contents(url: string) {
  const c = new pg.Client({ connectionString: url })
  await c.connect()
  try {
    const { rows: tables } = await c.query(
      `SELECT schemaname, tablename FROM pg_tables WHERE schemaname IN ('public', 'drizzle') ORDER BY 1, 2`)
    const out = new Map<string, string[]>()
    for (const t of tables) {
      const { rows } = await c.query(`SELECT t::text AS r FROM "${t.schemaname}"."${t.tablename}" t`)
      out.set(`${t.schemaname}.${t.tablename}`, rows.map(r => r.r as string).sort())
    }
    return out
  }
  finally { await c.end() }
}

const admin = new pg.Client({ connectionString: adminUrl })
beforeAll(async () => {
  await admin.connect()
  await admin.query(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`)
  await admin.query(`CREATE DATABASE ${scratch}`)
})
afterAll(async () => {
  await admin.query(`DROP DATABASE IF EXISTS ${scratch} WITH (FORCE)`)
  await admin.end()
  rmSync(dir, { recursive: true, force: true })
})

describe('backups', () => {
  it('backs up, restores into an empty database with every record, and refuses to clobber without --clean', async () => {
    const backup = npm(['db:backup'], DATABASE_URL)
    expect(backup.status, backup.stderr).toBe(0)
    const file = backup.stdout.trim().split('\n').pop()!
    expect(file).toMatch(/wayside-\d{8}T\d{6}Z(-\d+)?\.dump$/)
    expect(existsSync(file)).toBe(true)
    // The test database does not change between the dump and this read: the API tests run one file at a time.
    const source = await contents(DATABASE_URL)
    expect(source.get('public.calls')!.length).toBeGreaterThan(10)

    const restore = npm(['db:restore', '--', file], scratchUrl)
    expect(restore.status, restore.stderr).toBe(0)
    const restored = await contents(scratchUrl)
    expect([...restored.keys()]).toEqual([...source.keys()])
    for (const [table, rows] of source) expect(restored.get(table), table).toEqual(rows)

    // Now it holds tables: a plain restore is refused and changes nothing.
    const c = new pg.Client({ connectionString: scratchUrl })
    await c.connect()
    await c.query(`UPDATE customers SET name = name || ' (after the backup)' WHERE id = (SELECT id FROM customers ORDER BY id LIMIT 1)`)
    await c.end()
    const refused = npm(['db:restore', '--', file], scratchUrl)
    expect(refused.status).not.toBe(0)
    expect(refused.stderr).toMatch(/already holds \d+ tables.*--clean/)
    expect((await contents(scratchUrl)).get('public.customers')!.some(r => r.includes('(after the backup)'))).toBe(true)

    // --clean replaces what the backup holds.
    const clean = npm(['db:restore', '--', file, '--clean'], scratchUrl)
    expect(clean.status, clean.stderr).toBe(0)
    const again = await contents(scratchUrl)
    for (const [table, rows] of source) expect(again.get(table), table).toEqual(rows)
  }, 180_000)

  it('refuses a file that is not a backup', () => {
    const r = npm(['db:restore', '--', fileURLToPath(import.meta.url)], scratchUrl)
    expect(r.status).not.toBe(0)
    expect(r.stderr).toMatch(/not a pg_dump custom-format backup/)
  })
})

// The scripts' own check that the tools are Debian's.
it('uses Debian\'s pg_dump', () => {
  const bin = process.env.WAYSIDE_PG_BIN ?? ''
  expect(execFileSync(`${bin}/pg_dump`, ['--version']).toString()).toMatch(/pg_dump \(PostgreSQL\) \d+/)
})
