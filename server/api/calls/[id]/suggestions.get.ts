import { eq } from 'drizzle-orm'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const call = await useDb().query.calls.findFirst({ where: eq(tables.calls.id, id) })
  if (!call) throw createError({ status: 404, statusText: 'Call not found' })
  return suggestionsFor(call)
})
