import { stockLineCreateSchema } from '#shared/schemas/stock'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(stockLineCreateSchema))
  const line = await addStockLine(id, input, admin.id)
  if (!line) throw createError({ status: 404, statusText: 'No such service truck' })
  setResponseStatus(event, 201)
  return line
})
