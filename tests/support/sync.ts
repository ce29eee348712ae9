// Helpers for the sync API tests: a device with its own clientId and seq counter, calls made
// directly in the test database (so tests never move the demo calls), and a pull that follows
// the cursor until what it waits for has arrived.
import { createHash, randomUUID } from 'node:crypto'
import { seedId } from '~~/server/db/seed/ids'
import type { ApiClient } from './api'
import { testPool } from './db'

export const IDS = {
  mech1: seedId('user:mech1'),
  mech2: seedId('user:mech2'),
  dispatcher: seedId('user:dispatch'),
  office: seedId('user:office'),
  customer: seedId('customer:prairie'),
  unit: seedId('unit:7'),
  truck11: seedId('truck:Truck 11'),
}

export type TestOp = {
  opId: string
  clientId: string
  seq: number
  at: string
  schemaVersion: number
  entity: string
  entityId: string
  action: 'create' | 'update'
  changes: Record<string, unknown>
  base?: Record<string, unknown>
  baseVersion?: number
}

export class Device {
  readonly clientId = randomUUID()
  seq = 0
  constructor(readonly api: ApiClient) {}

  op(entity: string, changes: Record<string, unknown>, extra: Partial<TestOp> = {}): TestOp {
    return {
      opId: randomUUID(), clientId: this.clientId, seq: ++this.seq, at: new Date().toISOString(), schemaVersion: 1,
      entity, entityId: randomUUID(), action: 'create', changes, ...extra,
    }
  }

  update(entity: string, entityId: string, changes: Record<string, unknown>, base?: Record<string, unknown>, baseVersion?: number) {
    const known = { ...(base ? { base } : {}), ...(baseVersion !== undefined ? { baseVersion } : {}) }
    return this.op(entity, changes, { action: 'update', entityId, ...known })
  }

  push(ops: TestOp[], extra: Record<string, unknown> = {}) {
    return this.api.post('/api/sync/push', { clientId: this.clientId, ops, ...extra })
  }

  pull(cursor?: string) {
    return this.api.get(`/api/sync/pull?clientId=${this.clientId}${cursor ? `&cursor=${cursor}` : ''}`)
  }
}

type Changes = Record<string, { id: string }[]>

/**
 * Pulls from `cursor` until `done` holds for everything received so far. Transactions of other
 * databases on the shared cluster can hold the cursor back for a moment; nothing is ever lost.
 */
export async function pullUntil(
  device: Device, cursor: string | undefined, done: (seen: Changes, revoked: Set<string>) => boolean, ms = 15_000,
) {
  const seen: Changes = {}
  const revoked = new Set<string>()
  const end = Date.now() + ms
  let next = cursor
  for (;;) {
    const r = await device.pull(next)
    if (r.status !== 200) throw new Error(`pull answered ${r.status}: ${JSON.stringify(r.body)}`)
    for (const [k, rows] of Object.entries(r.body.changes as Changes)) (seen[k] ??= []).push(...rows)
    for (const id of r.body.revokedCallIds as string[]) revoked.add(id)
    next = r.body.cursor
    if (done(seen, revoked) || Date.now() > end) return { seen, revoked, cursor: next as string, last: r.body }
    await new Promise(res => setTimeout(res, 200))
  }
}

export const idsOf = (rows: { id: string }[] | undefined) => new Set((rows ?? []).map(r => r.id))

// What this test file made, so cleanupSyncData() can take it away again: the browser tests run on
// the same database afterwards and count the mechanics' calls, conflicts and test cards.
const made = { calls: [] as string[], cards: [] as string[] }

/** Deletes the calls and test cards this file made, with every record pushed onto them. */
export async function cleanupSyncData() {
  const client = await testPool().connect()
  try {
    await client.query('BEGIN')
    const calls = made.calls, cards = made.cards
    await client.query(
      'DELETE FROM readings WHERE call_id = ANY($1) OR test_run_id IN (SELECT id FROM test_runs WHERE card_id = ANY($2))', [calls, cards])
    await client.query(`DELETE FROM links WHERE subject_id IN (SELECT id FROM approval_requests WHERE call_id = ANY($1))`, [calls])
    const tables = ['approvals', 'approval_requests', 'estimate_signatures', 'fault_codes', 'notes', 'photos', 'clock_events',
      'part_lines', 'sign_offs', 'conflicts', 'call_events']
    for (const t of tables) {
      await client.query(`DELETE FROM ${t} WHERE call_id = ANY($1)`, [calls])
    }
    await client.query('DELETE FROM test_runs WHERE call_id = ANY($1) OR card_id = ANY($2)', [calls, cards])
    // Invoices drafted on these calls, with what hangs on them (lines and adjustments cascade).
    const ofInvoices = 'invoice_id IN (SELECT id FROM invoices WHERE call_id = ANY($1))'
    for (const t of ['account_entries', 'refunds', 'credit_notes', 'checkout_sessions', 'payments']) {
      await client.query(`DELETE FROM ${t} WHERE ${ofInvoices}`, [calls])
    }
    await client.query('DELETE FROM invoices WHERE call_id = ANY($1)', [calls])
    await client.query('DELETE FROM calls WHERE id = ANY($1)', [calls])
    await client.query('DELETE FROM test_card_versions WHERE card_id = ANY($1)', [cards])
    await client.query('DELETE FROM test_cards WHERE id = ANY($1)', [cards])
    await client.query('COMMIT')
    made.calls = []
    made.cards = []
  }
  catch (err) {
    await client.query('ROLLBACK')
    throw err
  }
  finally { client.release() }
}

/** A call of our own, assigned to `mechanicId` (as dispatch would: with an 'assigned' event). */
export async function makeCall(opts: { mechanicId?: string | null, status?: string, storyCause?: string | null } = {}) {
  const id = randomUUID()
  made.calls.push(id)
  const mechanicId = opts.mechanicId === undefined ? IDS.mech1 : opts.mechanicId
  const status = opts.status ?? (mechanicId ? 'assigned' : 'received')
  await testPool().query(
    `INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id, assigned_at, story_cause)
     VALUES ($1, $2, $3, $4, 'Route 8 westbound shoulder, test', 'Test complaint: no crank', $5,
       CASE WHEN $5::uuid IS NULL THEN NULL ELSE now() END, $6)`,
    [id, status, IDS.customer, IDS.unit, mechanicId, opts.storyCause ?? null],
  )
  if (mechanicId) {
    await testPool().query(`INSERT INTO call_events (call_id, kind, to_status, mechanic_id) VALUES ($1, 'assigned', 'assigned', $2)`,
      [id, mechanicId])
  }
  return id
}

export async function callRow(id: string) {
  return (await testPool().query('SELECT * FROM calls WHERE id = $1', [id])).rows[0]
}

export const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex')

/** A real (tiny) JPEG: SOI, an APP0/JFIF header, and EOI; enough for a type check by magic bytes. */
export function jpegBytes(extra = 0) {
  return Buffer.concat([
    Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0x00, 0x10, 0x4a, 0x46, 0x49, 0x46, 0x00, 0x01, 0x01, 0x00, 0x00, 0x01, 0x00, 0x01, 0x00, 0x00]),
    Buffer.from(randomUUID()), Buffer.alloc(extra, 0x20), Buffer.from([0xff, 0xd9]),
  ])
}

export async function makeTestCard() {
  const cardId = randomUUID()
  made.cards.push(cardId)
  await testPool().query(`INSERT INTO test_cards (id, slug, title, component_type) VALUES ($1, $2, 'Sync test card', 'sensor')`,
    [cardId, `sync-test-${cardId}`])
  // A definition the card schema accepts (a seeded card's), so the pull hands the card out.
  await testPool().query(`INSERT INTO test_card_versions (card_id, card_version, definition)
    SELECT $1, 1, v.definition FROM test_card_versions v JOIN test_cards c ON c.id = v.card_id AND v.card_version = c.current_version
    WHERE c.active ORDER BY c.slug LIMIT 1`, [cardId])
  return cardId
}
