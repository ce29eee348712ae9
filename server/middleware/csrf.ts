// State-changing API requests must carry `X-Wayside: 1` and a JSON or raw-bytes body, which a
// form on another site cannot send without a CORS preflight we never grant.
const SAFE = new Set(['GET', 'HEAD', 'OPTIONS'])
const EXEMPT = new Set(['/api/payments/webhook']) // signed by the payment service instead

export default defineEventHandler((event) => {
  const path = event.path.split('?')[0] ?? ''
  if (!path.startsWith('/api/') || SAFE.has(event.method) || EXEMPT.has(path)) return
  if (getRequestHeader(event, 'x-wayside') !== '1') {
    throw createError({ status: 403, statusText: 'Missing the X-Wayside request header' })
  }
  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  const formLike = type === 'application/x-www-form-urlencoded' || type === 'multipart/form-data' || type === 'text/plain'
  if (formLike) throw createError({ status: 415, statusText: 'Send JSON or raw bytes' })
})
