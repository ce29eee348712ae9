import { dutySchema, idParamsSchema } from '#shared/schemas/users'

// Dispatch puts a mechanic on or off duty (one who forgot to end their shift, say).
export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { onDuty } = await readValidatedBody(event, validateWith(dutySchema))
  const row = await setMechanicDuty(id, onDuty)
  if (!row) throw createError({ status: 404, statusText: 'No such mechanic' })
  return row
})
