import { and, asc, eq, or, sql } from 'drizzle-orm'
import type { User } from '#auth-utils'

/**
 * A service truck's stock, for picking part lines on the phone. A mechanic reads only the truck
 * they drive or one on a call of theirs; undefined (a 404) otherwise.
 */
export async function truckStockFor(user: User, truckId: string) {
  const db = useDb()
  const { serviceTrucks, truckStock, users, calls } = tables
  if (user.role === 'mechanic') {
    const [ok] = await db.select({ n: sql<number>`1` }).from(serviceTrucks).where(and(eq(serviceTrucks.id, truckId), or(
      sql`EXISTS (SELECT 1 FROM ${users} WHERE ${users.id} = ${user.id} AND ${users.homeTruckId} = ${serviceTrucks.id})`,
      sql`EXISTS (SELECT 1 FROM ${calls} WHERE ${calls.mechanicId} = ${user.id} AND ${calls.serviceTruckId} = ${serviceTrucks.id})`,
    )))
    if (!ok) return undefined
  }
  const truck = await db.query.serviceTrucks.findFirst({ where: eq(serviceTrucks.id, truckId) })
  if (!truck) return undefined
  const items = await db.select({
    id: truckStock.id, truckId: truckStock.truckId, partNumber: truckStock.partNumber, description: truckStock.description,
    quantity: truckStock.quantity, unitPriceCents: truckStock.unitPriceCents, coreChargeCents: truckStock.coreChargeCents,
    version: truckStock.version,
    bin: truckStock.bin, minimum: truckStock.minimum,
    // What the shop paid is the office's business, not the phone's.
    costCents: user.role === 'mechanic' ? sql<number | null>`NULL` : truckStock.costCents,
  }).from(truckStock).where(eq(truckStock.truckId, truckId)).orderBy(asc(truckStock.partNumber))
  return { truck: { id: truck.id, name: truck.name }, items }
}
