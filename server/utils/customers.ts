import { and, asc, desc, eq, ilike, or, sql, type SQL } from 'drizzle-orm'
import type { z } from 'zod'
import type { Db, Tx } from './db'
import type { customerCreateSchema, customerListQuerySchema, customerPatchSchema, siteCreateSchema } from '#shared/schemas/customers'

/** `%text%` for ILIKE with the user's % and _ taken literally. */
export function likePattern(q: string) {
  return `%${q.replace(/[%_\\]/g, m => `\\${m}`)}%`
}

export async function listCustomers(q: z.output<typeof customerListQuerySchema>) {
  const { customers } = tables
  const where: SQL[] = []
  if (q.q) {
    const like = likePattern(q.q)
    where.push(or(ilike(customers.name, like), ilike(customers.phone, like), ilike(customers.billingEmail, like))!)
  }
  const cond = where.length ? and(...where) : undefined
  // Correlated subqueries name their tables outright: drizzle leaves columns unqualified in a one-table select.
  const openCalls = sql<number>`(SELECT count(*)::int FROM calls oc WHERE oc.customer_id = "customers"."id"
    AND oc.status NOT IN (${sql.join(CLOSED_STATUSES.map(s => sql`${s}`), sql`, `)}))`
  const unitCount = sql<number>`(SELECT count(*)::int FROM units cu WHERE cu.customer_id = "customers"."id")`
  const sortCol = {
    name: customers.name, kind: customers.kind, billingTerms: customers.billingTerms, createdAt: customers.createdAt, openCalls,
  }[q.sort ?? 'name']
  const order = q.dir === 'desc' ? desc(sortCol) : asc(sortCol)
  const db = useDb()
  const [rows, [n]] = await Promise.all([
    db.select({ customer: customers, openCalls, unitCount }).from(customers).where(cond)
      .orderBy(order, asc(customers.name), asc(customers.id)).limit(q.pageSize).offset((q.page - 1) * q.pageSize),
    db.select({ n: sql<number>`count(*)::int` }).from(customers).where(cond),
  ])
  return { items: rows.map(r => ({ ...withoutXid(r.customer), openCalls: r.openCalls, unitCount: r.unitCount })), total: n?.n ?? 0 }
}

export async function getCustomer(id: string) {
  const db = useDb()
  const row = await db.query.customers.findFirst({ where: eq(tables.customers.id, id) })
  if (!row) return null
  const [sites, units] = await Promise.all([
    db.select().from(tables.customerSites).where(eq(tables.customerSites.customerId, id)).orderBy(asc(tables.customerSites.name)),
    db.select().from(tables.units).where(eq(tables.units.customerId, id)).orderBy(asc(tables.units.unitNumber)),
  ])
  return { ...withoutXid(row), sites: sites.map(withoutXid), units: units.map(withoutXid) }
}

export async function createCustomer(tx: Tx | Db, input: z.output<typeof customerCreateSchema>) {
  const [row] = await tx.insert(tables.customers).values(input).returning()
  return withoutXid(row!)
}

/** 409 with the record as it is now, so the editor can show what changed. */
export function staleAnswer(current: unknown, what = 'record'): never {
  throw createError({ status: 409, statusText: `Someone else changed this ${what} first`, data: { current } })
}

export async function updateCustomer(id: string, patch: z.output<typeof customerPatchSchema>) {
  const { version, ...changes } = patch
  const db = useDb()
  const existing = await db.query.customers.findFirst({ where: eq(tables.customers.id, id) })
  if (!existing) return null
  // Switching to card drops net days; switching to account needs them (checked here against the stored row too).
  const terms = changes.billingTerms ?? existing.billingTerms
  if (terms === 'card') changes.netDays = null
  else if ((changes.netDays === undefined ? existing.netDays : changes.netDays) === null) {
    ruleError('netDays', 'An account customer needs net days (0 for due on receipt)')
  }
  const [row] = await db.update(tables.customers).set(changes)
    .where(and(eq(tables.customers.id, id), eq(tables.customers.version, version))).returning()
  if (!row) staleAnswer(await getCustomer(id), 'customer')
  return withoutXid(row)
}

export async function addSite(customerId: string, input: z.output<typeof siteCreateSchema>) {
  const [row] = await useDb().insert(tables.customerSites).values({ ...input, customerId }).returning()
  return withoutXid(row!)
}
