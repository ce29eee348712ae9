import { stockTransferSchema } from '#shared/schemas/stock'

export default defineEventHandler(async (event) => {
  const admin = await requireRole(event, 'admin')
  const input = await readValidatedBody(event, validateWith(stockTransferSchema))
  const done = await transferStock(input, admin.id)
  setResponseStatus(event, 201)
  return done
})
