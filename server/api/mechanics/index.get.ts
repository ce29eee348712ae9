import { and, asc, eq, sql } from 'drizzle-orm'

// The office's view of the mechanics: who is on duty, where they were last seen, how busy they are.
export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const { users } = tables
  // Named outright: in a one-table select drizzle leaves columns unqualified.
  const openCalls = sql<number>`(SELECT count(*)::int FROM calls mc WHERE mc.mechanic_id = "users"."id"
    AND mc.status IN ('assigned', 'en_route', 'on_site'))`
  const items = await useDb().select({
    id: users.id, name: users.name, phone: users.phone, onDuty: users.onDuty, lastLat: users.lastLat, lastLon: users.lastLon,
    lastPositionAt: users.lastPositionAt, homeTruckId: users.homeTruckId, openCalls,
  }).from(users).where(and(eq(users.role, 'mechanic'), eq(users.active, true))).orderBy(asc(users.name))
  return { items }
})
