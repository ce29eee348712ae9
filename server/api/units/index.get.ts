import { unitListQuerySchema } from '#shared/schemas/units'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const query = await getValidatedQuery(event, validateWith(unitListQuerySchema))
  return listUnits(query)
})
