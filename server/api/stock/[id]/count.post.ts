import { stockCountSchema } from '#shared/schemas/stock'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(stockCountSchema))
  const done = await countStock(id, input, admin.id)
  if (!done) throw createError({ status: 404, statusText: 'No such stock line' })
  return done
})
