// A photo the mechanic sent with the request, through the approval link.
export default defineEventHandler(async (event) => {
  const token = getRouterParam(event, 'token')
  const photoId = String(getRouterParam(event, 'photoId') ?? '').toLowerCase()
  const { request } = await requestOfApprovalLink(token)
  const { bytes, contentType } = await approvalLinkPhoto(request.photoIds, photoId)
  setResponseHeaders(event, {
    'content-type': contentType, 'content-length': bytes.length, 'cache-control': 'private, no-store',
    'x-content-type-options': 'nosniff', 'referrer-policy': 'no-referrer',
  })
  return bytes
})
