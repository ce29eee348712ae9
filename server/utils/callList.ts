// The calls list (GET /api/calls): filters, text search, page by page or by a keyset cursor.
import { and, asc, desc, eq, inArray, sql, type SQL } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { z } from 'zod'
import type { callListQuerySchema } from '#shared/schemas/calls'
import { CALL_STATUSES, OPEN_STATUSES } from '#shared/utils/callStatus'
import { awaitingApprovalSql } from './approvals'
import { callSearchCondition } from './callSearch'
import { tables, type Db } from './db'

type Query = z.output<typeof callListQuerySchema>

/** The list's sort keys; ties go by call number in the same direction, so (key, number) orders every call once. */
const SORTS = {
  number: { col: () => tables.calls.number, cast: 'int' },
  receivedAt: { col: () => tables.calls.receivedAt, cast: 'timestamptz' },
  statusChangedAt: { col: () => tables.calls.statusChangedAt, cast: 'timestamptz' },
  status: { col: () => tables.calls.status, cast: 'call_status' },
} as const

const badCursor = () => createError({
  status: 400, statusText: 'Bad cursor', message: 'after: not a cursor this list gave',
  data: { fields: { after: 'Not a cursor this list gave' } },
})

/** A keyset cursor: the sort value and call number of the last call on a page. */
function encodeCursor(value: unknown, number: number) {
  const v = value instanceof Date ? value.toISOString() : value
  return Buffer.from(JSON.stringify([v, number])).toString('base64url')
}

function decodeCursor(cursor: string): [string | number, number] {
  try {
    const parsed = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8')) as unknown
    if (Array.isArray(parsed) && parsed.length === 2 && ['string', 'number'].includes(typeof parsed[0]) && Number.isInteger(parsed[1])) {
      return parsed as [string | number, number]
    }
  }
  catch { /* answered below */ }
  throw badCursor()
}

/** A time in the cursor: PostgreSQL's microseconds kept whole (a JS Date would cut them to milliseconds and repeat calls). */
const ISO_MICROS = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d{1,6})?Z$/
const sortKey = (sort: (typeof SORTS)[keyof typeof SORTS]) => (sort.cast === 'timestamptz'
  ? sql<string>`to_char(${sort.col()} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`
  : sort.col())

/** The calls after the cursor's call in the list's order: one range of the sort key's index, however deep. */
function afterCursor(q: Query, cursor: string): SQL {
  const { calls } = tables
  const [value, number] = decodeCursor(cursor)
  const sort = SORTS[q.sort ?? 'receivedAt']
  const cmp = sql.raw(q.dir === 'asc' ? '>' : '<')
  if (q.sort === 'number') return sql`${calls.number} ${cmp} ${number}`
  if (sort.cast === 'timestamptz' && !ISO_MICROS.test(String(value))) throw badCursor()
  if (sort.cast === 'call_status' && !(CALL_STATUSES as readonly unknown[]).includes(value)) throw badCursor()
  return sql`(${sort.col()}, ${calls.number}) ${cmp} (${String(value)}::${sql.raw(sort.cast)}, ${number})`
}

/**
 * The list's queries, not yet run: the page's ids (with their sort value and number), the page
 * itself (those calls with their customer, unit and mechanic, in one statement) and the count.
 * Every condition is on calls alone, so the ids and the count read calls' indexes, never a join;
 * the page joins only its own rows, and formats the cursor's key for those rows alone.
 */
export async function callListQueries(db: Db, user: Pick<User, 'id' | 'role'>, q: Query) {
  const { calls, customers, units, users } = tables
  const where: SQL[] = []
  if (user.role === 'mechanic') where.push(eq(calls.mechanicId, user.id))
  else if (q.mechanicId) where.push(eq(calls.mechanicId, q.mechanicId))
  if (q.status?.length) where.push(inArray(calls.status, q.status))
  // Open as the list of open statuses (not "none of the closed"), so the status index can read it.
  if (q.open) where.push(inArray(calls.status, [...OPEN_STATUSES]))
  if (q.customerId) where.push(eq(calls.customerId, q.customerId))
  if (q.unitId) where.push(eq(calls.unitId, q.unitId))
  if (q.q) where.push(await callSearchCondition(db, q.q))
  const cond = where.length ? and(...where) : undefined
  const sort = SORTS[q.sort ?? 'receivedAt']
  const sortCol = sort.col()
  const dir = q.dir === 'asc' ? asc : desc
  // A deep page by offset walks only the sort key's index; a cursor jumps straight to its place.
  // Aliased, so the page can order by them beside calls' own columns of the same names.
  const ids = db.select({
    id: sql<string>`${calls.id}`.as('page_id'), key: sql<unknown>`${sortCol}`.as('page_key'),
    number: sql<number>`${calls.number}`.as('page_number'),
  }).from(calls)
    .where(and(cond, q.after ? afterCursor(q, q.after) : undefined))
    .orderBy(dir(sortCol), dir(calls.number))
    .limit(q.pageSize + 1).offset(q.after ? 0 : (q.page - 1) * q.pageSize)
  const p = ids.as('p')
  const page = db.select({
    call: calls,
    key: sql<string | number>`${sortKey(sort)}`.as('key_text'),
    customer: { id: customers.id, name: customers.name, billingTerms: customers.billingTerms },
    unit: { id: units.id, unitNumber: units.unitNumber, vin: units.vin, yearMakeModel: units.yearMakeModel },
    mechanic: { id: users.id, name: users.name },
    awaitingApproval: awaitingApprovalSql(calls.id),
  }).from(p)
    .innerJoin(calls, eq(calls.id, p.id))
    .innerJoin(customers, eq(customers.id, calls.customerId))
    .leftJoin(units, eq(units.id, calls.unitId))
    .leftJoin(users, eq(users.id, calls.mechanicId))
    .orderBy(dir(p.key), dir(p.number))
  const count = db.select({ n: sql<number>`count(*)::int` }).from(calls).where(cond)
  return { ids, page, count }
}

/** Calls the user may see, filtered and paged; a mechanic only ever sees their own. */
export async function listCalls(user: User, q: Query) {
  const queries = await callListQueries(useDb(), user, q)
  const [rows, [count]] = await Promise.all([queries.page, queries.count])
  const items = rows.slice(0, q.pageSize)
  const last = items.at(-1)
  return {
    items: items.map(r => ({
      ...r.call, changeXid: undefined, awaitingApproval: r.awaitingApproval, customer: r.customer,
      unit: r.unit?.id ? r.unit : null, mechanic: r.mechanic?.id ? r.mechanic : null,
    })),
    total: count?.n ?? 0,
    /** The cursor (`after`) for the page that follows, null on the last page. */
    next: rows.length > q.pageSize && last ? encodeCursor(last.key, last.call.number) : null,
  }
}
