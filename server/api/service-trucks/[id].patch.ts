import { truckPatchSchema } from '#shared/schemas/stock'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const patch = await readValidatedBody(event, validateWith(truckPatchSchema))
  const truck = await updateTruck(id, patch)
  if (!truck) throw createError({ status: 404, statusText: 'No such service truck' })
  return truck
})
