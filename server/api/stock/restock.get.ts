import { restockQuerySchema } from '#shared/schemas/stock'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'office', 'admin')
  const { truckId } = await getValidatedQuery(event, validateWith(restockQuerySchema))
  return { rows: await restockList(truckId) }
})
