// Every request body is capped before any route reads it, by route: a declared Content-Length
// above the cap is refused at once, and a chunked body is counted as it arrives and cut off the
// moment it passes. A refusal is 413, and the connection is closed a moment later, so the rest
// is never kept (Node drops what arrives meanwhile).
import type { Socket } from 'node:net'
import type { H3Event } from 'h3'

const KB = 1024
const MB = 1024 * KB

/** The largest body each route takes; anything else takes `JSON_CAP`. */
export const JSON_CAP = 1 * MB
function capFor(path: string): number {
  if (path === '/api/auth/login') return 4 * KB
  if (path === '/api/sync/push') return 2 * MB
  // Payment events are small JSON; the provider's own events stay far below this.
  if (path === '/api/payments/webhook') return 256 * KB
  if (/^\/api\/photos\/[^/]+$/.test(path)) return Number(useRuntimeConfig().photoMaxBytes)
  return JSON_CAP
}

// How long a refused connection stays open after its 413, reading and dropping what still comes,
// so the answer reaches the client before the close (closing on unread bytes resets the
// connection, and the client would lose the answer).
const LINGER_MS = 1000

/**
 * Closes the connection a moment after the answer instead of at once: Node would destroy it as
 * soon as the answer is written when the client asked for `Connection: close`, and otherwise keep
 * draining the body for the next request; either way the rest of the body is dropped, not kept.
 */
function lingerThenClose(socket: Socket) {
  let closing = false
  const close = () => {
    if (closing) return
    closing = true
    socket.end() // our answer is out: nothing more from us
    socket.resume() // read and drop what the client still sends, so the close is not a reset
    setTimeout(() => socket.destroy(), LINGER_MS).unref()
  }
  socket.destroySoon = close
  return close
}

function tooLarge(event: H3Event, cap: number): never {
  const socket = event.node.req.socket
  if (socket) {
    const close = lingerThenClose(socket)
    event.node.res.once('finish', close)
  }
  const message = `The body is larger than this route takes (${cap} bytes)`
  throw createError({ status: 413, statusText: 'Payload Too Large', message, data: { maxBytes: cap } })
}

/** Reads a chunked body up to the cap; rejects as soon as it passes. */
function readChunked(event: H3Event, cap: number): Promise<Buffer> {
  const req = event.node.req
  return new Promise((resolve, reject) => {
    const chunks: Buffer[] = []
    let total = 0
    const onData = (chunk: Buffer) => {
      total += chunk.length
      if (total <= cap) {
        chunks.push(chunk)
        return
      }
      req.off('data', onData)
      req.resume() // flowing with no listener: the rest is dropped as it comes
      chunks.length = 0
      try {
        tooLarge(event, cap)
      }
      catch (err) {
        reject(err)
      }
    }
    req.on('data', onData)
    req.once('end', () => resolve(Buffer.concat(chunks)))
    req.once('error', reject)
  })
}

export default defineEventHandler(async (event) => {
  const req = event.node.req
  const cap = capFor(event.path.split('?')[0] ?? '')
  const declared = req.headers['content-length']
  if (declared !== undefined) {
    const n = Number(declared)
    if (!Number.isSafeInteger(n) || n < 0) throw createError({ status: 400, statusText: 'Bad Content-Length' })
    // Node's parser never hands over more than the declared length, so nothing more to count.
    if (n > cap) tooLarge(event, cap)
    return
  }
  if (!/\bchunked\b/i.test(String(req.headers['transfer-encoding'] ?? ''))) return
  const body = await readChunked(event, cap)
  // Handed on as a body of known length: h3's readers and the routes' own capped readers take it.
  delete req.headers['transfer-encoding']
  req.headers['content-length'] = String(body.length)
  ;(event as unknown as { _requestBody: Buffer })._requestBody = body
})
