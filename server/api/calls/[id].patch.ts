import { callPatchSchema } from '#shared/schemas/calls'
import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const patch = await readValidatedBody(event, validateWith(callPatchSchema))
  const result = await updateCall(id, patch, user)
  if (!result) throw createError({ status: 404, statusText: 'Call not found' })
  if (result === 'stale') staleAnswer(await getCallRecord(id), 'call')
  return (await getCallRecord(id))!
})
