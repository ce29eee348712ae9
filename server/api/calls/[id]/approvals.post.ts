import { idParamsSchema } from '#shared/schemas/users'
import { approvalDecisionSchema } from '#shared/schemas/approvals'

// The office records the fleet's answer (by phone or e-mail): who, how much, the PO, how.
export default defineEventHandler(async (event) => {
  const user = await requireRole(event, 'dispatcher', 'office', 'admin')
  const { id } = await getValidatedRouterParams(event, validateWith(idParamsSchema))
  const body = await readValidatedBody(event, validateWith(approvalDecisionSchema))
  await requireCallAccess(event, id)
  const answer = await recordApproval(id, body, { user })
  setResponseStatus(event, 201)
  return answer
})
