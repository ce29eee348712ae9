import { stockLinePatchSchema } from '#shared/schemas/stock'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const patch = await readValidatedBody(event, validateWith(stockLinePatchSchema))
  const line = await updateStockLine(id, patch)
  if (!line) throw createError({ status: 404, statusText: 'No such stock line' })
  return line
})
