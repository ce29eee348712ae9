import { idParamsSchema } from '#shared/schemas/users'
import { reportSendSchema } from '#shared/schemas/share'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { to } = await readValidatedBody(event, validateWith(reportSendSchema))
  const { call } = await requireCallAccess(event, id)
  return sendServiceReport(call, to, user)
})
