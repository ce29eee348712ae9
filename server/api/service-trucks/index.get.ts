import { asc, eq } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const { serviceTrucks } = tables
  const items = await useDb().select({ id: serviceTrucks.id, name: serviceTrucks.name, plate: serviceTrucks.plate })
    .from(serviceTrucks).where(eq(serviceTrucks.active, true)).orderBy(asc(serviceTrucks.name))
  return { items }
})
