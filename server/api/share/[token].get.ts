// The fleet's status page data, opened without an account. The token is checked by the links module
// alone: any failure (malformed, unknown, expired, revoked, the call paid) is the same 404.
export default defineEventHandler(async (event) => {
  const token = getRouterParam(event, 'token')
  const { call } = await callOfStatusLink(token)
  setResponseHeaders(event, { 'cache-control': 'no-store', 'referrer-policy': 'no-referrer', 'x-robots-tag': 'noindex' })
  return fleetStatusView(call, token!)
})
