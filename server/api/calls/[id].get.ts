import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { user } = await requireCallAccess(event, id)
  const record = await getCallRecord(id)
  if (!record) throw createError({ status: 404, statusText: 'Call not found' })
  // `view` says which answer this is: a mechanic's leaves out the customer's billing details.
  if (user.role === 'mechanic') return { ...forMechanic(record), view: 'mechanic' as const }
  return { ...record, view: 'office' as const }
})
