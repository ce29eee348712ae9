import { truckListQuerySchema } from '#shared/schemas/stock'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'office', 'admin')
  const query = await getValidatedQuery(event, validateWith(truckListQuerySchema))
  const items = await listTrucks({ all: query.all && user.role === 'admin' })
  return { items }
})
