import { asc } from 'drizzle-orm'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const rows = await useDb().select().from(tables.users).orderBy(asc(tables.users.name))
  return { items: rows.map(publicUser) }
})
