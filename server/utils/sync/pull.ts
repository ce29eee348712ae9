// GET /api/sync/pull: what changed since the device's cursor, scoped to what the user may see,
// in pages of at most `limit` rows, with `more: true` while a page follows.
//
// Late commits: every row carries change_xid, the id of the transaction that last wrote it. A pull
// hands out the rows with previous cursor <= change_xid < upto, where upto is the oldest
// transaction still running when the pull began (pg_snapshot_xmin). Every transaction below it has
// finished, so a writer that commits late (a low xid, committed after a higher one) is still above
// the cursor and comes in a later pull. Rows between upto and the newest commit may be sent twice;
// never missed.
//
// Pages: the first page fixes the window [from, upto); each page walks the collections in a fixed
// order by id, and the continuation cursor says where it stopped. A row written again between two
// pages has left the window for a later one, so nothing is missed there either. The card library
// and rates come whole on the first page.
//
// A mechanic's first pull (no cursor) is their working set, not their career: open calls, calls
// of the last SYNC_RECENT_DAYS, and the last few earlier calls of each unit among those, with the
// records, units and customers of those calls. Later pulls bring what changed on their calls.
import { and, asc, desc, eq, gt, inArray, sql, type SQL } from 'drizzle-orm'
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core'
import type { User } from '#auth-utils'
import { cardDefinitionSchema, type TestCardView } from '#shared/schemas/testCards'
import { parsePullCursor, pullCursor, SYNC_PULL_DEFAULT_LIMIT, type PullAnswer, type PullPosition } from '#shared/schemas/sync'
import { OPEN_STATUSES } from '#shared/utils/callStatus'
import { tables, type Db, type Tx } from '../db'
import { CALL_RECORD_TABLES } from './tables'

/** Earlier calls of each unit in the working set that come with it (the unit's recent history). */
export const SYNC_UNIT_HISTORY_CALLS = 5

const strip = <T extends { changeXid?: unknown }>(row: T) => {
  const { changeXid: _x, ...rest } = row
  return rest
}

function stripPhoto(row: Record<string, unknown>) {
  const { changeXid: _x, storageKey, ...rest } = row
  return { ...rest, uploaded: !!storageKey }
}

type Win = (col: PgColumn | SQL) => SQL
type IdTable = PgTable & { id: PgColumn }
/** One collection of the answer: its table, which rows this user gets, and how a row is handed out. */
type Source = {
  key: string
  table: IdTable
  where: SQL | undefined
  columns?: Record<string, PgColumn>
  out?: (row: Record<string, unknown>) => unknown
}

const badCursor = () => createError({
  status: 400, statusText: 'Bad cursor', message: 'cursor: not a cursor this server gave',
  data: { fields: { cursor: 'Not a cursor this server gave' } },
})

export async function syncPull(user: User, q: { cursor?: string, clientId?: string, limit?: number }): Promise<PullAnswer> {
  const limit = q.limit ?? SYNC_PULL_DEFAULT_LIMIT
  const at = q.cursor ? parsePullCursor(q.cursor) : { from: '0' } as PullPosition
  if (!at) throw badCursor()
  return useDb().transaction(async (tx) => {
    // The first statement fixes the snapshot; on a first page its xmin closes the window.
    const snap = await tx.execute<{ xmin: string }>(sql`SELECT pg_snapshot_xmin(pg_current_snapshot())::text AS xmin`)
    const from = at.from
    const upto = at.upto ?? snap.rows[0]!.xmin
    const firstPage = at.upto === undefined
    const win: Win = col => sql`(${col} >= ${from}::xid8 AND ${col} < ${upto}::xid8)`

    let lastSeq = 0
    if (q.clientId) {
      const [client] = await tx.select().from(tables.syncClients).where(eq(tables.syncClients.id, q.clientId))
      if (client && client.userId !== user.id) throw createError({ status: 403, statusText: 'This device is registered to another person' })
      lastSeq = client?.lastSeq ?? 0
    }

    const scope = user.role === 'mechanic' ? await mechanicScope(tx, user, win, from !== '0') : officeScope(win)
    if (at.k !== undefined && at.k >= scope.sources.length) throw badCursor()
    const changes: Record<string, unknown[]> = {}
    for (const s of scope.sources) changes[s.key] = []
    Object.assign(changes, firstPage ? await library(tx, win, from === '0') : { testCards: [], rates: [] })

    // Walk the collections from where the last page stopped.
    let room = limit
    let stop: { k: number, after: string } | undefined
    for (let k = at.k ?? 0; k < scope.sources.length; k++) {
      const s = scope.sources[k]!
      const rows = await pageQuery(tx, s, k === at.k ? at.after : undefined, room) as Record<string, unknown>[]
      const taken = rows.slice(0, room)
      changes[s.key]!.push(...taken.map(row => (s.out ?? strip)(row)))
      // More rows here than room: the next page goes on after the last one given.
      if (rows.length > room) {
        stop = { k, after: String(taken.at(-1)!.id) }
        break
      }
      room -= taken.length
      if (room === 0) {
        if (k < scope.sources.length - 1) stop = { k: k + 1, after: '' }
        break
      }
    }

    const { conflicts, calls } = tables
    const open = await tx.select({ conflict: conflicts }).from(conflicts)
      .innerJoin(calls, eq(calls.id, conflicts.callId))
      .where(and(eq(conflicts.status, 'open'), user.role === 'mechanic' ? eq(calls.mechanicId, user.id) : eq(conflicts.raisedBy, user.id)))
      .orderBy(desc(conflicts.createdAt))
    const revoked = firstPage ? await scope.revoked() : []
    const cursor = stop ? pullCursor({ from, upto, k: stop.k, after: stop.after || undefined }) : upto
    return {
      cursor, more: !!stop, lastSeq, changes: changes as PullAnswer['changes'], revokedCallIds: revoked,
      conflicts: open.map(r => strip(r.conflict)) as PullAnswer['conflicts'],
    }
  }, { isolationLevel: 'repeatable read', accessMode: 'read only' })
}

/** One collection's rows after `after` (by id), at most room + 1 so the caller sees whether more follow. */
const pageQuery = (tx: Tx | Db, s: Source, after: string | undefined, room: number) =>
  tx.select(s.columns as Record<string, PgColumn>).from(s.table as typeof tables.notes)
    .where(and(s.where, after ? gt(s.table.id, after) : undefined))
    .orderBy(asc(s.table.id)).limit(room + 1)

/** The first page's query of each collection of a mechanic's first pull (for EXPLAIN in the tests). */
export async function firstPullQueries(db: Db, user: User, days: number, limit: number) {
  const none: Win = () => sql`false`
  const scope = await mechanicScope(db as unknown as Tx, user, none, false, days)
  return scope.sources.map(s => [s.key, pageQuery(db, s, undefined, limit).toSQL()] as const)
}

/** The card library as GET /api/test-cards answers it; cards whose stored definition fails the card schema are left out. */
async function library(tx: Tx, win: Win, first: boolean) {
  const { testCards, testCardVersions, rates } = tables
  const rows = await tx.select({ card: testCards, v: testCardVersions }).from(testCards)
    .innerJoin(testCardVersions, and(eq(testCardVersions.cardId, testCards.id), eq(testCardVersions.cardVersion, testCards.currentVersion)))
    // A first pull: every card in use. Later: every card changed, turned-off ones included so the phone drops them.
    .where(first ? eq(testCards.active, true) : sql`${win(testCards.changeXid)} OR ${win(testCardVersions.changeXid)}`)
  const cards: TestCardView[] = []
  for (const { card, v } of rows) {
    const parsed = cardDefinitionSchema.safeParse(v.definition)
    if (!parsed.success) continue
    cards.push({
      id: card.id, slug: card.slug, title: card.title, componentType: card.componentType, active: card.active,
      currentVersion: card.currentVersion, version: v.cardVersion, definition: parsed.data, updatedAt: card.updatedAt.toISOString(),
    } satisfies TestCardView)
  }
  const rateRows = await tx.select().from(rates).where(win(rates.changeXid))
  return { testCards: cards, rates: rateRows.map(strip) }
}

function recordSources(where: (t: (typeof CALL_RECORD_TABLES)[keyof typeof CALL_RECORD_TABLES]) => SQL | undefined): Source[] {
  return (Object.keys(CALL_RECORD_TABLES) as (keyof typeof CALL_RECORD_TABLES)[]).map((key) => {
    const table = CALL_RECORD_TABLES[key]
    return { key, table, where: where(table), ...(key === 'photos' ? { out: stripPhoto } : {}) }
  })
}

function officeScope(win: Win) {
  const { calls, units, customers } = tables
  const sources: Source[] = [
    { key: 'calls', table: calls, where: win(calls.changeXid) },
    { key: 'units', table: units, where: win(units.changeXid) },
    { key: 'customers', table: customers, where: win(customers.changeXid) },
    ...recordSources(t => win(t.changeXid)),
  ]
  return { sources, revoked: async () => [] as string[] }
}

/** How many days back a first pull brings closed calls (runtime config syncRecentDays). */
const recentDays = () => Math.max(1, Number(useRuntimeConfig().syncRecentDays) || 30)

/**
 * Calls a mechanic's phone starts from: open ones, recent ones, and the last few earlier calls of
 * each unit among them. Each part is one range of an index of calls (calls_mechanic_idx,
 * calls_mechanic_recent_idx, calls_mechanic_unit_idx), never the mechanic's whole career.
 */
function workingSet(user: User, days: number) {
  const open = sql.join(OPEN_STATUSES.map(s => sql`${s}::call_status`), sql`, `)
  return sql`(
    WITH recent AS (
      SELECT id, unit_id FROM calls WHERE mechanic_id = ${user.id} AND status IN (${open})
      UNION
      SELECT id, unit_id FROM calls WHERE mechanic_id = ${user.id}
        AND coalesce(assigned_at, received_at) >= now() - make_interval(days => ${days})
    )
    SELECT id FROM recent
    UNION ALL
    SELECT e.id FROM (SELECT DISTINCT unit_id FROM recent WHERE unit_id IS NOT NULL) u CROSS JOIN LATERAL (
      SELECT c.id FROM calls c
      WHERE c.mechanic_id = ${user.id} AND c.unit_id = u.unit_id AND c.id NOT IN (SELECT id FROM recent)
      ORDER BY c.received_at DESC LIMIT ${SYNC_UNIT_HISTORY_CALLS}
    ) e
  )`
}

/** A Postgres array literal of uuids read from the database (nothing typed by a person), for `= ANY(…::uuid[])`. */
const uuidArray = (ids: readonly string[]) => sql`${`{${ids.join(',')}}`}::uuid[]`

/**
 * A first pull's collections: the working set's calls, with their units and customers, found in one
 * query and then read by key, one query per collection (the working set is not worked out again
 * for each of them).
 */
async function firstPullSources(tx: Tx, user: User, days: number): Promise<Source[]> {
  const { calls, units, customers } = tables
  const set = await tx.execute<{ id: string, unit_id: string | null, customer_id: string }>(
    sql`SELECT id, unit_id, customer_id FROM calls WHERE id IN ${workingSet(user, days)}`)
  const callIds = uuidArray(set.rows.map(r => r.id))
  const unitIds = uuidArray([...new Set(set.rows.flatMap(r => (r.unit_id ? [r.unit_id] : [])))])
  const customerIds = uuidArray([...new Set(set.rows.map(r => r.customer_id))])
  return [
    { key: 'calls', table: calls, where: and(sql`${calls.id} = ANY(${callIds})`, eq(calls.mechanicId, user.id)) },
    { key: 'units', table: units, where: sql`${units.id} = ANY(${unitIds})` },
    {
      key: 'customers', table: customers, columns: MECHANIC_CUSTOMER_COLUMNS(), out: mechanicCustomerRow,
      where: sql`${customers.id} = ANY(${customerIds})`,
    },
    ...recordSources(t => sql`${t.callId} = ANY(${callIds})`),
  ]
}

/**
 * A mechanic needs who and how to reach them, not billing terms or account notes; tax exemption prices the estimate,
 * and whether the driver signs it before the work is said in a word of its own (the terms are read, never handed out).
 */
const MECHANIC_CUSTOMER_COLUMNS = () => {
  const { customers } = tables
  return {
    id: customers.id, name: customers.name, kind: customers.kind, phone: customers.phone, taxExempt: customers.taxExempt,
    version: customers.version, updatedAt: customers.updatedAt, billingTerms: customers.billingTerms,
  }
}
const mechanicCustomerRow = ({ billingTerms, ...row }: Record<string, unknown>) => ({
  ...row, signsEstimate: signsEstimate({ billingTerms }),
})

/** Ids of the calls any of whose records (the device's or the server's) changed in the window. */
function callsWithChangedRecords(win: Win) {
  const parts = Object.values(CALL_RECORD_TABLES).map(t => sql`SELECT ${t.callId} FROM ${t} WHERE ${win(t.changeXid)}`)
  return sql`(${sql.join(parts, sql` UNION `)})`
}

/**
 * A mechanic's pull. The first is the working set. Later ones bring every changed row on the
 * mechanic's calls, and a call with it whenever one of its records changed, so a page never holds a
 * record whose call the phone lacks (calls are walked first). A call outside the working set that
 * changed, and a call assigned inside the window, come whole: the phone may never have held them.
 */
async function mechanicScope(tx: Tx, user: User, win: Win, incremental: boolean, days = recentDays()) {
  if (!incremental) return { sources: await firstPullSources(tx, user, days), revoked: async () => [] as string[] }
  const { calls, units, customers, callEvents } = tables
  const mine = sql`(SELECT id FROM calls WHERE mechanic_id = ${user.id})`
  const assigned = await tx.selectDistinct({ id: callEvents.callId }).from(callEvents).innerJoin(calls, eq(calls.id, callEvents.callId))
    .where(and(
      eq(calls.mechanicId, user.id), eq(callEvents.mechanicId, user.id), win(callEvents.changeXid),
      sql`(${callEvents.kind} IN ('assigned', 'reassigned') OR ${callEvents.toStatus} = 'assigned')`,
    ))
  const outside = await tx.select({ id: calls.id }).from(calls).where(and(
    eq(calls.mechanicId, user.id),
    sql`${calls.id} NOT IN ${workingSet(user, days)}`,
    sql`(${win(calls.changeXid)} OR ${calls.id} IN ${callsWithChangedRecords(win)})`,
  ))
  const whole = [...new Set([...assigned, ...outside].map(r => r.id))]
  const wholeOr = (col: PgColumn) => (whole.length ? inArray(col, whole) : sql`false`)
  const callWhere = sql`(${win(calls.changeXid)} OR ${wholeOr(calls.id)} OR ${calls.id} IN ${callsWithChangedRecords(win)})`
  // The units and customers of the calls this pull hands out.
  const callRows = sql`(SELECT unit_id, customer_id FROM calls WHERE id IN ${mine} AND ${callWhere})`

  const sources: Source[] = [
    { key: 'calls', table: calls, where: and(sql`${calls.id} IN ${mine}`, eq(calls.mechanicId, user.id), callWhere) },
    {
      key: 'units', table: units,
      where: and(sql`${units.id} IN (SELECT unit_id FROM calls WHERE mechanic_id = ${user.id})`,
        sql`(${win(units.changeXid)} OR ${units.id} IN (SELECT unit_id FROM ${callRows} c))`),
    },
    {
      key: 'customers', table: customers, columns: MECHANIC_CUSTOMER_COLUMNS(), out: mechanicCustomerRow,
      where: and(sql`${customers.id} IN (SELECT customer_id FROM calls WHERE mechanic_id = ${user.id})`,
        sql`(${win(customers.changeXid)} OR ${customers.id} IN (SELECT customer_id FROM ${callRows} c))`),
    },
    ...recordSources(t => and(sql`${t.callId} IN ${mine}`, sql`(${win(t.changeXid)} OR ${wholeOr(t.callId)})`)),
  ]

  // Calls taken away: changed in the window, not this mechanic's now, but assigned to them once.
  const revoked = async () => (await tx.select({ id: calls.id }).from(calls).where(and(
    win(calls.changeXid),
    sql`${calls.mechanicId} IS DISTINCT FROM ${user.id}`,
    sql`EXISTS (SELECT 1 FROM call_events e WHERE e.call_id = ${calls.id} AND e.mechanic_id = ${user.id})`,
  ))).map(r => r.id)
  return { sources, revoked }
}
