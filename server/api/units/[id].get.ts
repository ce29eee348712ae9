import { unitHistoryQuerySchema } from '#shared/schemas/units'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { before } = await getValidatedQuery(event, validateWith(unitHistoryQuerySchema))
  const unit = await getUnitWithHistory(id, user, before)
  if (!unit) throw createError({ status: 404, statusText: 'Unit not found' })
  return user.role === 'mechanic' ? { ...unit, customer: mechanicCustomer(unit.customer) } : unit
})
