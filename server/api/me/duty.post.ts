import { dutySchema } from '#shared/schemas/users'

// A mechanic starts or ends their own shift.
export default defineEventHandler(async (event) => {
  const me = await requireRole(event, 'mechanic')
  const { onDuty } = await readValidatedBody(event, validateWith(dutySchema))
  const row = await setMechanicDuty(me.id, onDuty)
  if (!row) throw createError({ status: 404, statusText: 'No such mechanic' })
  return row
})
