import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  await requireCallAccess(event, id)
  const record = await getCallRecord(id)
  if (!record) throw createError({ status: 404, statusText: 'Call not found' })
  return record
})
