// Service trucks for the admin: each with the mechanics whose home truck it is, and at a glance
// how its stock stands (lines below their minimum, parts used beyond what was on hand).
import { and, eq, ne, sql } from 'drizzle-orm'
import type { z } from 'zod'
import type { truckCreateSchema, truckPatchSchema } from '#shared/schemas/stock'
import type { Tx } from './db'

interface TruckRow {
  id: string
  name: string
  plate: string | null
  active: boolean
  version: number
  mechanics: { id: string, name: string }[]
  lines: number
  belowMinimum: number
  shortLines: number
}

type TruckCreate = z.output<typeof truckCreateSchema>
type TruckPatch = z.output<typeof truckPatchSchema>

export async function listTrucks(opts: { all?: boolean } = {}) {
  const { serviceTrucks: t } = tables
  const rows = await useDb().execute(sql`
    SELECT t.id, t.name, t.plate, t.active, t.version,
      coalesce((SELECT json_agg(json_build_object('id', u.id, 'name', u.name) ORDER BY u.name)
        FROM users u WHERE u.home_truck_id = t.id AND u.role = 'mechanic'), '[]') AS mechanics,
      (SELECT count(*)::int FROM truck_stock s WHERE s.truck_id = t.id) AS lines,
      (SELECT count(*)::int FROM truck_stock s WHERE s.truck_id = t.id AND s.quantity < s.minimum) AS "belowMinimum",
      (SELECT count(*)::int FROM truck_stock s WHERE s.truck_id = t.id AND s.quantity < 0) AS "shortLines"
    FROM ${t} t
    WHERE ${opts.all ? sql`true` : sql`t.active`}
    ORDER BY t.name`)
  return rows.rows as unknown as TruckRow[]
}

/** 422 naming `mechanicId` unless it is an active mechanic. */
async function checkMechanic(tx: Tx, mechanicId: string) {
  const u = tables.users
  const [m] = await tx.select({ role: u.role, active: u.active }).from(u).where(eq(u.id, mechanicId))
  if (!m || m.role !== 'mechanic' || !m.active) ruleError('mechanicId', 'Pick a mechanic who can sign in')
}

/** This truck becomes `mechanicId`'s home truck, and no longer anyone else's; null leaves it with nobody. */
async function setTruckMechanic(tx: Tx, truckId: string, mechanicId: string | null) {
  const u = tables.users
  await tx.update(u).set({ homeTruckId: null })
    .where(and(eq(u.homeTruckId, truckId), mechanicId ? ne(u.id, mechanicId) : sql`true`))
  if (mechanicId) await tx.update(u).set({ homeTruckId: truckId }).where(eq(u.id, mechanicId))
}

async function nameTaken(tx: Tx, name: string, exceptId?: string) {
  const t = tables.serviceTrucks
  const [row] = await tx.select({ id: t.id }).from(t)
    .where(and(sql`lower(${t.name}) = lower(${name})`, exceptId ? ne(t.id, exceptId) : sql`true`))
  if (row) ruleError('name', 'Another truck has this name')
}

export async function createTruck(input: TruckCreate) {
  return useDb().transaction(async (tx) => {
    await nameTaken(tx, input.name)
    if (input.mechanicId) await checkMechanic(tx, input.mechanicId)
    const [row] = await tx.insert(tables.serviceTrucks).values({ name: input.name, plate: input.plate ?? null }).returning()
    if (input.mechanicId !== undefined) await setTruckMechanic(tx, row!.id, input.mechanicId)
    return row!
  })
}

/** Undefined when there is no such truck; 409 with the truck as it is when `version` is stale. */
export async function updateTruck(id: string, patch: TruckPatch) {
  const t = tables.serviceTrucks
  return useDb().transaction(async (tx) => {
    const [current] = await tx.select().from(t).where(eq(t.id, id)).for('update')
    if (!current) return undefined
    if (current.version !== patch.version) {
      const message = 'Someone changed this truck meanwhile'
      throw createError({ status: 409, statusText: 'Changed meanwhile', message, data: { current } })
    }
    if (patch.name !== undefined) await nameTaken(tx, patch.name, id)
    if (patch.mechanicId) await checkMechanic(tx, patch.mechanicId)
    const set: Partial<typeof t.$inferInsert> = {}
    if (patch.name !== undefined) set.name = patch.name
    if (patch.plate !== undefined) set.plate = patch.plate
    if (patch.active !== undefined) set.active = patch.active
    // Touch the row even when only the mechanic changes, so its version moves.
    const [row] = await tx.update(t).set({ ...set, name: set.name ?? current.name }).where(eq(t.id, id)).returning()
    if (patch.mechanicId !== undefined) await setTruckMechanic(tx, id, patch.mechanicId)
    return row!
  })
}

/** 422 naming `homeTruckId` unless the person is a mechanic and the truck is in service. */
export async function checkHomeTruck(userId: string, truckId: string) {
  const db = useDb()
  const [u] = await db.select({ role: tables.users.role }).from(tables.users).where(eq(tables.users.id, userId))
  if (u && u.role !== 'mechanic') ruleError('homeTruckId', 'Only mechanics have a home truck')
  const trucks = tables.serviceTrucks
  const [t] = await db.select({ active: trucks.active }).from(trucks).where(eq(trucks.id, truckId))
  if (!t?.active) ruleError('homeTruckId', 'Pick a truck in service')
}
