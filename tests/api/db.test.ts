import { execFileSync } from 'node:child_process'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { DATABASE_URL } from '../support/env'

// A database of its own, so this test sees migrations land on nothing at all.
const scratchName = `wayside_scratch_${process.pid}`
const adminUrl = DATABASE_URL.replace(/\/[^/]+$/, '/postgres')
const scratchUrl = DATABASE_URL.replace(/\/[^/]+$/, `/${scratchName}`)
const run = (script: string) => execFileSync('npx', ['tsx', script], {
  env: { ...process.env, NUXT_DATABASE_URL: scratchUrl }, stdio: 'pipe',
})

const TABLES = [
  'invoices', 'invoice_lines', 'payments', 'users', 'customers', 'customer_sites', 'units', 'calls', 'call_events', 'yards',
  'service_trucks', 'truck_stock', 'rates', 'fault_codes', 'readings', 'part_lines', 'clock_events', 'notes', 'sign_offs',
  'test_cards', 'test_card_versions',
]

async function counts(client: pg.Client) {
  const out: Record<string, number> = {}
  for (const t of TABLES) out[t] = (await client.query(`SELECT count(*)::int AS n FROM ${t}`)).rows[0].n
  return out
}

describe('database', () => {
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

  // Four tsx runs: on a busy shared machine this takes longer than a unit of work usually may.
  it('applies the migrations to an empty database and seeds twice without duplicating anything', { timeout: 240_000 }, async () => {
    run('server/db/migrate.ts')
    run('server/db/seed/index.ts')
    const client = new pg.Client({ connectionString: scratchUrl })
    await client.connect()
    try {
      const first = await counts(client)
      expect(first.users).toBeGreaterThanOrEqual(5)
      expect(first.units).toBe(20)
      const statuses = (await client.query('SELECT DISTINCT status FROM calls')).rows.map(r => r.status)
      expect(statuses.sort()).toEqual(['assigned', 'cancelled', 'completed', 'en_route', 'invoiced', 'on_site', 'paid', 'received'])
      run('server/db/migrate.ts')
      run('server/db/seed/index.ts')
      expect(await counts(client)).toEqual(first)
    }
    finally { await client.end() }
  }, 240_000) // four tsx runs: slow on a busy machine

  it('bumps version and the change transaction on every write, whatever the writer sends', async () => {
    const client = new pg.Client({ connectionString: scratchUrl })
    await client.connect()
    try {
      const { rows: [before] } = await client.query('SELECT id, version, change_xid::text AS x FROM customers LIMIT 1')
      await client.query('UPDATE customers SET notes = $2, version = 999 WHERE id = $1', [before.id, 'changed'])
      const { rows: [after] } = await client.query('SELECT version, change_xid::text AS x FROM customers WHERE id = $1', [before.id])
      expect(after.version).toBe(before.version + 1)
      expect(BigInt(after.x)).toBeGreaterThan(BigInt(before.x))
    }
    finally { await client.end() }
  })
})
