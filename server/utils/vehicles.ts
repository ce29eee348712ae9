// Units (the customer's vehicles): list, read with their call history, add, edit.
import { and, asc, desc, eq, gte, ilike, inArray, lte, notInArray, or, sql, type SQL } from 'drizzle-orm'
import type { z } from 'zod'
import type { User } from '#auth-utils'
import type { unitCreateSchema, unitDraftSchema, unitListQuerySchema, unitPatchSchema } from '#shared/schemas/units'
import { tables, type Db, type Tx } from './db'

export async function listUnits(q: z.output<typeof unitListQuerySchema>) {
  const { units, customers } = tables
  const where: SQL[] = []
  if (q.customerId) where.push(eq(units.customerId, q.customerId))
  if (q.q) {
    const like = likePattern(q.q)
    where.push(or(
      ilike(units.unitNumber, like), ilike(units.vin, like), ilike(units.yearMakeModel, like),
      ilike(units.engine, like), ilike(customers.name, like),
    )!)
  }
  const cond = where.length ? and(...where) : undefined
  // Correlated subqueries name their tables outright (drizzle may leave columns unqualified).
  const lastCall = sql<string | null>`(SELECT max(uc.received_at) FROM calls uc WHERE uc.unit_id = "units"."id")`
  const callCount = sql<number>`(SELECT count(*)::int FROM calls uc WHERE uc.unit_id = "units"."id")`
  const sortCol = {
    unitNumber: units.unitNumber, customer: customers.name, yearMakeModel: units.yearMakeModel, odometer: units.odometer, lastCall,
  }[q.sort ?? 'unitNumber']
  const order = q.dir === 'desc' ? sql`${sortCol} DESC NULLS LAST` : sql`${sortCol} ASC NULLS LAST`
  const db = useDb()
  const [rows, [n]] = await Promise.all([
    db.select({ unit: units, customer: { id: customers.id, name: customers.name }, lastCall, callCount })
      .from(units).innerJoin(customers, eq(customers.id, units.customerId)).where(cond)
      .orderBy(order, asc(units.unitNumber), asc(units.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
    db.select({ n: sql<number>`count(*)::int` }).from(units).innerJoin(customers, eq(customers.id, units.customerId)).where(cond),
  ])
  return {
    items: rows.map(r => ({
      ...withoutXid(r.unit), customer: r.customer, lastCallAt: r.lastCall ? new Date(r.lastCall) : null, callCount: r.callCount,
    })),
    total: n?.n ?? 0,
  }
}

/** Calls on a unit's page of history; older ones come by the `moreCalls` cursor. */
export const UNIT_HISTORY_PAGE = 20

const DAY_MS = 86_400_000

/** The unit history's cursor: when the last call shown was received, and its number. */
function historyCursor(c: { receivedKey: string, number: number }) {
  return Buffer.from(JSON.stringify([c.receivedKey, c.number])).toString('base64url')
}

/** PostgreSQL's microseconds kept whole: a JS Date would cut them to milliseconds and skip calls received together. */
const ISO_MICROS = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d{1,6})?Z$/

function readHistoryCursor(cursor: string): [string, number] {
  try {
    const v = JSON.parse(Buffer.from(cursor, 'base64url').toString('utf8')) as unknown
    if (Array.isArray(v) && typeof v[0] === 'string' && ISO_MICROS.test(v[0]) && Number.isInteger(v[1])) return [v[0], v[1]]
  }
  catch { /* answered below */ }
  throw createError({
    status: 400, statusText: 'Bad cursor', message: 'before: not a cursor this unit page gave',
    data: { fields: { before: 'Not a cursor this unit page gave' } },
  })
}

/** One page of a unit's calls, newest first, after the cursor's call (a mechanic's own only, when mechanicId is given). */
export function unitHistoryQuery(db: Db, unitId: string, mechanicId: string | undefined, cursor?: [string, number]) {
  const { calls } = tables
  return db.query.calls.findMany({
    where: and(eq(calls.unitId, unitId), mechanicId ? eq(calls.mechanicId, mechanicId) : undefined,
      cursor ? sql`(${calls.receivedAt}, ${calls.number}) < (${cursor[0]}::timestamptz, ${cursor[1]})` : undefined),
    orderBy: [desc(calls.receivedAt), desc(calls.number)],
    limit: UNIT_HISTORY_PAGE + 1,
    extras: {
      receivedKey: sql<string>`to_char(${calls.receivedAt} AT TIME ZONE 'UTC', 'YYYY-MM-DD"T"HH24:MI:SS.US"Z"')`.as('received_key'),
    },
    with: {
      faultCodes: { orderBy: [asc(tables.faultCodes.createdAt)] },
      partLines: { orderBy: [asc(tables.partLines.createdAt)] },
      mechanic: { columns: { id: true, name: true } },
    },
  })
}

/**
 * A unit with its customer and a page of its calls, newest first (a mechanic: only their own),
 * comebacks flagged; `before` (the last answer's `moreCalls`) asks for the next older page. The
 * comeback rule reads the calls around the page too, so a flag does not depend on where a page ends.
 */
export async function getUnitWithHistory(id: string, user: User, before?: string) {
  const db = useDb()
  const { calls } = tables
  const cursor = before ? readHistoryCursor(before) : undefined
  const unit = await db.query.units.findFirst({ where: eq(tables.units.id, id), with: { customer: true } })
  if (!unit) return null
  const mine = user.role === 'mechanic' ? eq(calls.mechanicId, user.id) : undefined
  const [rows, [count]] = await Promise.all([
    unitHistoryQuery(db, id, user.role === 'mechanic' ? user.id : undefined, cursor),
    db.select({ n: sql<number>`count(*)::int` }).from(calls).where(and(eq(calls.unitId, id), mine)),
  ])
  // A mechanic may read a unit only through a call of theirs.
  if (user.role === 'mechanic' && !count?.n) return null
  const page = rows.slice(0, UNIT_HISTORY_PAGE)
  const window = (COMEBACK_WINDOW_DAYS + 1) * DAY_MS
  const around = page.length
    ? await db.query.calls.findMany({
        columns: { id: true, number: true, receivedAt: true },
        where: and(eq(calls.unitId, id), mine, notInArray(calls.id, page.map(c => c.id)),
          gte(calls.receivedAt, new Date(page.at(-1)!.receivedAt.getTime() - window)),
          lte(calls.receivedAt, new Date(page[0]!.receivedAt.getTime() + window))),
        with: { faultCodes: { columns: { code: true, spn: true, fmi: true } } },
      })
    : []
  const all = [...page, ...around]
  const comebacks = findComebacks(all.map(c => ({ id: c.id, at: c.receivedAt, faultCodes: c.faultCodes })))
  const numberOf = new Map(all.map(c => [c.id, c.number]))
  return {
    ...withoutXid(unit),
    customer: withoutXid(unit.customer),
    calls: page.map(c => ({
      id: c.id, number: c.number, status: c.status, outcome: c.outcome, receivedAt: c.receivedAt, completedAt: c.completedAt,
      locationText: c.locationText, complaint: c.complaint, mechanic: c.mechanic,
      story: { complaint: c.storyComplaint, cause: c.storyCause, correction: c.storyCorrection },
      faultCodes: c.faultCodes.map(f => ({
        id: f.id, code: f.code, spn: f.spn, fmi: f.fmi, state: f.state, count: f.count, description: describeFaultCodeSafe(f),
      })),
      partLines: c.partLines.map(p => ({ id: p.id, partNumber: p.partNumber, description: p.description, quantity: p.quantity })),
      comebacks: comebacks.filter(x => x.callId === c.id).map(x => ({ ...x, earlierNumber: numberOf.get(x.earlierCallId) ?? null })),
      repeatedBy: comebacks.filter(x => x.earlierCallId === c.id).map(x => ({ ...x, laterNumber: numberOf.get(x.callId) ?? null })),
    })),
    /** Every call on the unit this person may see, on this page or older ones. */
    callCount: count?.n ?? 0,
    /** Pass as `before` for the next older page; null when this page holds the oldest call. */
    moreCalls: rows.length > UNIT_HISTORY_PAGE ? historyCursor(page.at(-1)!) : null,
  }
}

/** describeFaultCode for stored rows: a malformed code from a device is shown as typed, not a 500. */
export function describeFaultCodeSafe(f: { code: string | null, spn: number | null, fmi: number | null }) {
  try {
    return describeFaultCode(f)
  }
  catch (err) { return { label: f.code ?? `SPN ${f.spn} FMI ${f.fmi}`, problem: (err as Error).message } }
}

async function assertNumberFree(tx: Tx | Db, customerId: string, unitNumber: string, exceptId?: string, field = 'unitNumber') {
  const same = await tx.select({ id: tables.units.id }).from(tables.units)
    .where(and(eq(tables.units.customerId, customerId), eq(tables.units.unitNumber, unitNumber)))
  if (same.some(r => r.id !== exceptId)) ruleError(field, `This customer already has a unit numbered ${unitNumber}`)
}

export async function createUnit(tx: Tx | Db, customerId: string, input: z.output<typeof unitDraftSchema>, field = 'unitNumber') {
  await assertNumberFree(tx, customerId, input.unitNumber, undefined, field)
  const [row] = await tx.insert(tables.units).values({ ...input, customerId }).returning()
  return withoutXid(row!)
}

export async function createUnitFor(input: z.output<typeof unitCreateSchema>) {
  const { customerId, ...rest } = input
  const customer = await useDb().query.customers.findFirst({ where: eq(tables.customers.id, customerId), columns: { id: true } })
  if (!customer) ruleError('customerId', 'No such customer')
  return createUnit(useDb(), customerId, rest)
}

export async function updateUnit(id: string, patch: z.output<typeof unitPatchSchema>, user: User) {
  const { version, ...changes } = patch
  const db = useDb()
  const existing = await db.query.units.findFirst({ where: eq(tables.units.id, id) })
  if (!existing) return null
  if (changes.customerId && changes.customerId !== existing.customerId) {
    const c = await db.query.customers.findFirst({ where: eq(tables.customers.id, changes.customerId), columns: { id: true } })
    if (!c) ruleError('customerId', 'No such customer')
  }
  if (changes.unitNumber || changes.customerId) {
    await assertNumberFree(db, changes.customerId ?? existing.customerId, changes.unitNumber ?? existing.unitNumber, id)
  }
  const [row] = await db.update(tables.units).set(changes)
    .where(and(eq(tables.units.id, id), eq(tables.units.version, version))).returning()
  if (!row) staleAnswer(await getUnitWithHistory(id, user), 'unit')
  return withoutXid(row)
}

/** Units of these ids that belong to the customer, for checking a pick. */
export async function unitBelongsTo(tx: Tx | Db, unitId: string, customerId: string) {
  const rows = await tx.select({ id: tables.units.id }).from(tables.units)
    .where(and(inArray(tables.units.id, [unitId]), eq(tables.units.customerId, customerId)))
  return rows.length > 0
}
