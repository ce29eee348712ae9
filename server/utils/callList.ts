import { and, asc, desc, eq, ilike, inArray, notInArray, or, sql, type SQL } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { z } from 'zod'
import type { callListQuerySchema } from '#shared/schemas/calls'

/** Calls the user may see, filtered and paged; a mechanic only ever sees their own. */
export async function listCalls(user: User, q: z.output<typeof callListQuerySchema>) {
  const { calls, customers, units, users } = tables
  const where: SQL[] = []
  if (user.role === 'mechanic') where.push(eq(calls.mechanicId, user.id))
  else if (q.mechanicId) where.push(eq(calls.mechanicId, q.mechanicId))
  if (q.status?.length) where.push(inArray(calls.status, q.status))
  if (q.open) where.push(notInArray(calls.status, [...CLOSED_STATUSES]))
  if (q.customerId) where.push(eq(calls.customerId, q.customerId))
  if (q.unitId) where.push(eq(calls.unitId, q.unitId))
  if (q.q) {
    const like = `%${q.q.replace(/[%_\\]/g, m => `\\${m}`)}%`
    where.push(or(
      ilike(customers.name, like), ilike(units.unitNumber, like), ilike(units.vin, like),
      ilike(calls.locationText, like), ilike(calls.complaint, like), ilike(calls.poNumber, like),
      sql`${calls.number}::text = ${q.q}`,
    )!)
  }
  const cond = where.length ? and(...where) : undefined
  const sortCol = {
    number: calls.number, receivedAt: calls.receivedAt, statusChangedAt: calls.statusChangedAt, status: calls.status,
  }[q.sort ?? 'receivedAt']
  const order = q.dir === 'asc' ? asc(sortCol) : desc(sortCol)

  const db = useDb()
  const base = db.select({
    call: calls,
    customer: { id: customers.id, name: customers.name, billingTerms: customers.billingTerms },
    unit: { id: units.id, unitNumber: units.unitNumber, vin: units.vin, yearMakeModel: units.yearMakeModel },
    mechanic: { id: users.id, name: users.name },
    awaitingApproval: awaitingApprovalSql(calls.id),
  }).from(calls)
    .innerJoin(customers, eq(customers.id, calls.customerId))
    .leftJoin(units, eq(units.id, calls.unitId))
    .leftJoin(users, eq(users.id, calls.mechanicId))
    .where(cond)
  const [rows, [count]] = await Promise.all([
    base.orderBy(order, desc(calls.number)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
    db.select({ n: sql<number>`count(*)::int` }).from(calls)
      .innerJoin(customers, eq(customers.id, calls.customerId))
      .leftJoin(units, eq(units.id, calls.unitId))
      .where(cond),
  ])
  return {
    items: rows.map(r => ({
      ...r.call, changeXid: undefined, awaitingApproval: r.awaitingApproval, customer: r.customer,
      unit: r.unit?.id ? r.unit : null, mechanic: r.mechanic?.id ? r.mechanic : null,
    })),
    total: count?.n ?? 0,
  }
}
