// The first error handler (nuxt.config.ts puts it before Nuxt's own): it names what went wrong in
// terms a client can act on and carries the request id a person can quote.
//  - the database not answering is 503 with Retry-After (a load balancer or the phone tries again),
//    never a 500;
//  - text the database cannot store that slipped past a schema is 400, never a 500;
//  - JSON answers (API routes) are sent here with `requestId`; pages go on to Nuxt's error page,
//    which shows the same id.
import type { H3Error, H3Event } from 'h3'
import { getRequestHeader, send, setResponseHeader, setResponseHeaders, setResponseStatus } from 'h3'
import type { NitroErrorHandler } from 'nitropack'
import { logLine } from './utils/requestLog'

export const RETRY_AFTER_SECONDS = 5

type Cause = { code?: unknown, message?: unknown, cause?: unknown, column?: unknown }

function chain(error: unknown): Cause[] {
  const out: Cause[] = []
  let e = error as Cause | undefined
  for (let i = 0; e && typeof e === 'object' && i < 6; i++, e = e.cause as Cause | undefined) out.push(e)
  return out
}

// Node socket errors on the way to PostgreSQL, and PostgreSQL refusing connections (class 08,
// shutting down, starting up, too many connections).
const DOWN_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN', 'EPIPE',
  '57P01', '57P02', '57P03', '53300'])
const DOWN_MESSAGES = /Connection terminated|connection timeout|timeout exceeded when trying to connect|Client has encountered a connection error|database system is (starting up|shutting down|in recovery)/i

/** Whether an error means the database (or another service it needs) is not answering. */
export function isUnavailable(error: unknown): boolean {
  return chain(error).some((e) => {
    const code = typeof e.code === 'string' ? e.code : ''
    return DOWN_CODES.has(code) || code.startsWith('08') || (typeof e.message === 'string' && DOWN_MESSAGES.test(e.message))
  })
}

/** A PostgreSQL data exception (class 22: a NUL in text, a value out of range): bad input, not a fault. */
function badValue(error: unknown): Cause | undefined {
  return chain(error).find(e => typeof e.code === 'string' && e.code.length === 5 && e.code.startsWith('22'))
}

function wantsJson(event: H3Event) {
  const accept = (getRequestHeader(event, 'accept') ?? '').toLowerCase()
  if (accept.includes('text/html')) return false
  return accept.includes('application/json') || event.path.startsWith('/api/') || event.path.endsWith('.json')
}

function reshape(error: H3Error, event: H3Event) {
  if (isUnavailable(error)) {
    error.statusCode = 503
    error.statusMessage = 'Service Unavailable'
    error.message = 'Wayside cannot reach its database just now; try again in a moment'
    error.unhandled = false
    error.data = { retryAfter: RETRY_AFTER_SECONDS }
    setResponseHeader(event, 'retry-after', RETRY_AFTER_SECONDS)
    return
  }
  const bad = error.statusCode >= 500 ? badValue(error) : undefined
  if (bad) {
    const field = typeof bad.column === 'string' ? bad.column : '_'
    const message = 'A value in the request cannot be stored (a control character, or a value out of range)'
    error.statusCode = 400
    error.statusMessage = 'Bad Request'
    error.message = message
    error.unhandled = false
    error.data = { fields: { [field]: message } }
  }
}

const handler: NitroErrorHandler = async (error, event, { defaultHandler }) => {
  reshape(error, event)
  const requestId = event.context.requestId as string | undefined
  const status = error.statusCode || 500
  if (error.unhandled || error.fatal || status >= 500) {
    const path = event.path.split('?')[0]
    logLine('error', { requestId, method: event.method, path, status, error: String(error.cause ?? error.message), stack: error.stack })
  }
  if (!wantsJson(event)) return // pages: Nuxt renders app/error.vue
  const res = await defaultHandler(error, event, { json: true, silent: true })
  const { url: _url, ...body } = typeof res.body === 'object' && res.body ? res.body : { message: String(res.body) }
  // A bare createError({ statusText }) has no message: the status text says it.
  body.message ||= body.statusMessage
  body.requestId = requestId
  setResponseHeaders(event, res.headers)
  setResponseStatus(event, res.status, res.statusText)
  return send(event, JSON.stringify(body))
}

export default handler
