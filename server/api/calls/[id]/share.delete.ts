import { idParamsSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { call } = await requireCallAccess(event, id)
  const revoked = await revokeLinks('call_status', call.id)
  if (revoked) {
    await useDb().insert(tables.callEvents).values({ callId: call.id, kind: 'status_link_revoked', byUserId: user.id,
      note: `Status link${revoked > 1 ? 's' : ''} turned off` })
  }
  return { revoked }
})
