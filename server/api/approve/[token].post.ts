import { linkDecisionSchema } from '#shared/schemas/approvals'

// The fleet's contact answers on the page: through the same rule as the office's, with channel 'link'.
export default defineEventHandler(async (event) => {
  const token = getRouterParam(event, 'token')
  const body = await readValidatedBody(event, validateWith(linkDecisionSchema))
  const { link, call, request } = await requestOfApprovalLink(token)
  setResponseHeaders(event, { 'cache-control': 'no-store', 'referrer-policy': 'no-referrer' })
  const amountCents = body.amountCents ?? request.estimateCents
  const answer = await recordApproval(call.id, { ...body, amountCents, channel: 'link' }, { linkId: link.id, requestId: request.id })
  setResponseStatus(event, 201)
  return { decision: answer.approval.decision, amountCents: answer.approval.amountCents, poNumber: answer.approval.poNumber }
})
