import { unitPatchSchema } from '#shared/schemas/units'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const patch = await readValidatedBody(event, validateWith(unitPatchSchema))
  const unit = await updateUnit(id, patch, user)
  if (!unit) throw createError({ status: 404, statusText: 'Unit not found' })
  return unit
})
