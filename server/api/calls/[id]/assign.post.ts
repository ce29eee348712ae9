import { callAssignSchema } from '#shared/schemas/calls'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(callAssignSchema))
  const done = await assignCall(id, input, user)
  if (!done) throw createError({ status: 404, statusText: 'Call not found' })
  return { ...(await getCallRecord(id))!, mail: done.mail }
})
