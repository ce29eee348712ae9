// The fleet's approval page data, opened without an account. Any failure (malformed, unknown, expired,
// revoked, already answered, the call billed or cancelled) is the same 404.
export default defineEventHandler(async (event) => {
  const token = getRouterParam(event, 'token')
  const { call, request } = await requestOfApprovalLink(token)
  setResponseHeaders(event, { 'cache-control': 'no-store', 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex' })
  return approvalLinkView(token!, call, request)
})
