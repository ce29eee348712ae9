import type { H3Event } from 'h3'
import type { z } from 'zod'
import { describeFieldErrors, fieldErrorsOf } from '#shared/utils/fieldErrors'

// Request bodies read with a hard size cap: a body that declares too many bytes is refused before
// any of it is buffered, and one sent without a length is cut off as soon as it passes the cap.

function tooLarge(maxBytes: number): never {
  throw createError({ status: 413, statusText: 'Payload Too Large', message: `The body is larger than ${maxBytes} bytes` })
}

/** The declared Content-Length, or undefined when the body is sent chunked. */
export function declaredLength(event: H3Event): number | undefined {
  const raw = getRequestHeader(event, 'content-length')
  if (raw === undefined) return undefined
  const n = Number(raw)
  if (!Number.isSafeInteger(n) || n < 0) throw createError({ status: 400, statusText: 'Bad Content-Length' })
  return n
}

/** Refuses (413) a declared length above the cap; call before reading anything. */
export function assertDeclaredLength(event: H3Event, maxBytes: number) {
  const n = declaredLength(event)
  if (n !== undefined && n > maxBytes) tooLarge(maxBytes)
}

export async function readCappedBody(event: H3Event, maxBytes: number): Promise<Buffer> {
  const declared = declaredLength(event)
  if (declared !== undefined) {
    if (declared > maxBytes) tooLarge(maxBytes)
    // Node's parser never hands over more than the declared length, so this read is bounded.
    return (await readRawBody(event, false)) ?? Buffer.alloc(0)
  }
  const req = event.node.req
  return new Promise<Buffer>((resolve, reject) => {
    const chunks: Buffer[] = []
    let total = 0
    req.on('data', (chunk: Buffer) => {
      total += chunk.length
      if (total > maxBytes) {
        req.removeAllListeners('data')
        req.resume() // drain the rest without keeping it
        reject(createError({ status: 413, statusText: 'Payload Too Large', message: `The body is larger than ${maxBytes} bytes` }))
        return
      }
      chunks.push(chunk)
    })
    req.on('end', () => resolve(Buffer.concat(chunks)))
    req.on('error', reject)
  })
}

/** Whether JSON text nests objects/arrays deeper than `max`, found in one pass before parsing. */
export function jsonDeeperThan(text: string, max: number): boolean {
  let depth = 0
  let inString = false
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i)
    if (inString) {
      if (c === 92) i++ // backslash: skip the escaped character
      else if (c === 34) inString = false
    }
    else if (c === 34) inString = true
    else if (c === 123 || c === 91) {
      if (++depth > max) return true
    }
    else if (c === 125 || c === 93) depth--
  }
  return false
}

function badBody(message: string): never {
  throw createError({ status: 400, statusText: 'Bad Request', message, data: { fields: { _: message } } })
}

/** A JSON body, size- and depth-capped, with `__proto__` keys dropped. */
export async function readCappedJson(event: H3Event, opts: { maxBytes: number, maxDepth: number }): Promise<unknown> {
  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  if (type !== 'application/json') throw createError({ status: 415, statusText: 'Send the body as application/json' })
  const text = (await readCappedBody(event, opts.maxBytes)).toString('utf8')
  if (jsonDeeperThan(text, opts.maxDepth)) badBody(`The body nests deeper than ${opts.maxDepth} levels`)
  try {
    // The reviver costs time on every value, so it runs only when the text could need it.
    return text.includes('"__proto__"') ? JSON.parse(text, (key, value) => (key === '__proto__' ? undefined : value)) : JSON.parse(text)
  }
  catch {
    badBody('The body is not valid JSON')
  }
}

/** Parses with a zod schema, answering 400 with `data.fields` like validateWith does. */
export function parseOr400<S extends z.ZodType>(schema: S, input: unknown): z.output<S> {
  const parsed = schema.safeParse(input)
  if (parsed.success) return parsed.data
  const fields = fieldErrorsOf(parsed.error)
  throw createError({ status: 400, statusText: 'Validation Error', message: describeFieldErrors(fields), data: { fields } })
}
