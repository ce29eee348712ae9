// GET /api/sync/pull: what changed since the device's cursor, scoped to what the user may see.
//
// Late commits: every row carries change_xid, the id of the transaction that last wrote it. The
// pull runs in its own REPEATABLE READ snapshot and hands out the rows with
// previous cursor <= change_xid < xmin, where xmin = pg_snapshot_xmin(pg_current_snapshot()) is the
// oldest transaction still running. Every transaction below xmin has finished, so a writer that
// commits late (a low xid, committed after a higher one) is still above the cursor and comes in a
// later pull. Rows between xmin and the newest commit may be sent twice; never missed.
import { and, desc, eq, inArray, sql, type SQL } from 'drizzle-orm'
import type { PgColumn } from 'drizzle-orm/pg-core'
import type { User } from '#auth-utils'
import type { Tx } from '../db'
import { CALL_RECORD_TABLES, type CallRecordCollection } from './tables'

const strip = <T extends { changeXid?: unknown }>(row: T) => {
  const { changeXid: _x, ...rest } = row
  return rest
}

function stripPhoto(row: typeof tables.photos.$inferSelect) {
  const { changeXid: _x, storageKey, ...rest } = row
  return { ...rest, uploaded: !!storageKey }
}

export async function syncPull(user: User, q: { cursor?: string, clientId?: string }) {
  const prev = q.cursor ?? '0'
  return useDb().transaction(async (tx) => {
    // The first statement fixes the snapshot; its xmin is the new cursor.
    const snap = await tx.execute<{ cursor: string }>(sql`SELECT pg_snapshot_xmin(pg_current_snapshot())::text AS cursor`)
    const cursor = snap.rows[0]!.cursor
    const win = (col: PgColumn | SQL) => sql`(${col} >= ${prev}::xid8 AND ${col} < ${cursor}::xid8)`

    let lastSeq = 0
    if (q.clientId) {
      const [client] = await tx.select().from(tables.syncClients).where(eq(tables.syncClients.id, q.clientId))
      if (client && client.userId !== user.id) throw createError({ status: 403, statusText: 'This device is registered to another person' })
      lastSeq = client?.lastSeq ?? 0
    }

    const body = user.role === 'mechanic' ? await mechanicChanges(tx, user, win, prev !== '0') : await officeChanges(tx, win)
    const { conflicts, calls } = tables
    const open = await tx.select({ conflict: conflicts }).from(conflicts)
      .innerJoin(calls, eq(calls.id, conflicts.callId))
      .where(and(eq(conflicts.status, 'open'), user.role === 'mechanic' ? eq(calls.mechanicId, user.id) : eq(conflicts.raisedBy, user.id)))
      .orderBy(desc(conflicts.createdAt))
    return { cursor, lastSeq, ...body, conflicts: open.map(r => strip(r.conflict)) }
  }, { isolationLevel: 'repeatable read', accessMode: 'read only' })
}

type Win = (col: PgColumn | SQL) => SQL

// Every record of a call, by the registry's collection names (plus the server's timeline and conflicts).
const CHILDREN = CALL_RECORD_TABLES
type ChildKey = CallRecordCollection

async function library(tx: Tx, win: Win) {
  const { testCards, testCardVersions, rates } = tables
  const cards = await tx.select({ card: testCards, definition: testCardVersions.definition }).from(testCards)
    .innerJoin(testCardVersions, and(eq(testCardVersions.cardId, testCards.id), eq(testCardVersions.cardVersion, testCards.currentVersion)))
    .where(sql`${win(testCards.changeXid)} OR ${win(testCardVersions.changeXid)}`)
  const rateRows = await tx.select().from(rates).where(win(rates.changeXid))
  return {
    testCards: cards.map(c => ({ ...strip(c.card), definition: c.definition })),
    rates: rateRows.map(strip),
  }
}

async function childrenWhere(tx: Tx, where: (t: (typeof CHILDREN)[ChildKey]) => SQL | undefined) {
  const out = {} as { [K in ChildKey]: unknown[] }
  for (const key of Object.keys(CHILDREN) as ChildKey[]) {
    const table = CHILDREN[key]
    const rows = await tx.select().from(table as typeof tables.notes).where(where(table))
    out[key] = key === 'photos' ? (rows as unknown as (typeof tables.photos.$inferSelect)[]).map(stripPhoto) : rows.map(strip)
  }
  return out
}

async function officeChanges(tx: Tx, win: Win) {
  const { calls, units, customers } = tables
  const [callRows, unitRows, customerRows] = [
    await tx.select().from(calls).where(win(calls.changeXid)),
    await tx.select().from(units).where(win(units.changeXid)),
    await tx.select().from(customers).where(win(customers.changeXid)),
  ]
  return {
    changes: {
      calls: callRows.map(strip), units: unitRows.map(strip), customers: customerRows.map(strip),
      ...await childrenWhere(tx, t => win(t.changeXid)),
      ...await library(tx, win),
    },
    revokedCallIds: [] as string[],
  }
}

async function mechanicChanges(tx: Tx, user: User, win: Win, incremental: boolean) {
  const { calls, units, customers, callEvents } = tables
  const mine = sql`(SELECT id FROM calls WHERE mechanic_id = ${user.id})`
  // Calls assigned to this mechanic inside the window come whole: their older records too.
  const assigned = incremental
    ? await tx.selectDistinct({ id: callEvents.callId }).from(callEvents).innerJoin(calls, eq(calls.id, callEvents.callId))
        .where(and(
          eq(calls.mechanicId, user.id), eq(callEvents.mechanicId, user.id), win(callEvents.changeXid),
          sql`(${callEvents.kind} IN ('assigned', 'reassigned') OR ${callEvents.toStatus} = 'assigned')`,
        ))
    : []
  const whole = assigned.map(r => r.id)
  const wholeSql = whole.length ? inArray(calls.id, whole) : sql`false`
  const callRows = await tx.select().from(calls).where(and(eq(calls.mechanicId, user.id), sql`(${win(calls.changeXid)} OR ${wholeSql})`))
  const unitIds = [...new Set(callRows.map(c => c.unitId).filter((x): x is string => !!x))]
  const customerIds = [...new Set(callRows.map(c => c.customerId))]

  const unitRows = await tx.select().from(units).where(and(
    sql`${units.id} IN (SELECT unit_id FROM calls WHERE mechanic_id = ${user.id})`,
    sql`(${win(units.changeXid)} OR ${unitIds.length ? inArray(units.id, unitIds) : sql`false`})`,
  ))
  // A mechanic needs who and how to reach them, not billing terms or account notes.
  const customerRows = await tx.select({
    id: customers.id, name: customers.name, kind: customers.kind, phone: customers.phone, version: customers.version, updatedAt: customers.updatedAt,
  }).from(customers).where(and(
    sql`${customers.id} IN (SELECT customer_id FROM calls WHERE mechanic_id = ${user.id})`,
    sql`(${win(customers.changeXid)} OR ${customerIds.length ? inArray(customers.id, customerIds) : sql`false`})`,
  ))

  const children = await childrenWhere(tx, t => and(
    sql`${t.callId} IN ${mine}`,
    sql`(${win(t.changeXid)} OR ${whole.length ? inArray(t.callId, whole) : sql`false`})`,
  ))

  // Calls taken away: changed in the window, not this mechanic's now, but assigned to them once.
  const revoked = incremental
    ? await tx.select({ id: calls.id }).from(calls).where(and(
        win(calls.changeXid),
        sql`${calls.mechanicId} IS DISTINCT FROM ${user.id}`,
        sql`EXISTS (SELECT 1 FROM call_events e WHERE e.call_id = ${calls.id} AND e.mechanic_id = ${user.id})`,
      ))
    : []
  return {
    changes: { calls: callRows.map(strip), units: unitRows.map(strip), customers: customerRows, ...children, ...await library(tx, win) },
    revokedCallIds: revoked.map(r => r.id),
  }
}
