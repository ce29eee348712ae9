import { callCancelSchema } from '#shared/schemas/calls'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const input = await readValidatedBody(event, validateWith(callCancelSchema))
  const result = await cancelCall(id, input, user)
  if (!result) throw createError({ status: 404, statusText: 'Call not found' })
  if (result === 'stale') staleAnswer(await getCallRecord(id), 'call')
  return (await getCallRecord(id))!
})
