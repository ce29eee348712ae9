import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { call } = await requireCallAccess(event, id)
  return statusLinkState(call.id)
})
