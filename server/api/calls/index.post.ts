import { callCreateSchema } from '#shared/schemas/calls'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'admin')
  const input = await readValidatedBody(event, validateWith(callCreateSchema))
  const { call, mail } = await createCall(input, user)
  setResponseStatus(event, 201)
  // Said at once, so the dispatcher can tell the caller "we already have someone on that truck".
  const openCallsOnSameUnit = await openCallsOnUnit(call.unitId, call.id)
  return { ...(await getCallRecord(call.id))!, mail, openCallsOnSameUnit }
})
