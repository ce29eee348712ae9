import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const stock = await truckStockFor(user, id)
  if (!stock) throw createError({ status: 404, statusText: 'Service truck not found' })
  return stock
})
