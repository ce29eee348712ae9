import { callCreateSchema } from '#shared/schemas/calls'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'admin')
  const input = await readValidatedBody(event, validateWith(callCreateSchema))
  const { call, mechanic } = await createCall(input, user)
  const mail = mechanic ? await mailAssignmentSafely(call.id) : null
  setResponseStatus(event, 201)
  return { ...(await getCallRecord(call.id))!, mail }
})
