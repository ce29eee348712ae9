import { idParamsSchema } from '#shared/schemas/users'
import { approvalLinkSchema } from '#shared/schemas/approvals'

// A link for the fleet to answer the call's open request on its own page; e-mailed with `sendTo`, else copied.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const { sendTo } = await readValidatedBody(event, validateWith(approvalLinkSchema))
  const { call } = await requireCallAccess(event, id)
  return makeApprovalLink(call, user, sendTo)
})
