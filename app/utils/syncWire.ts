// What the server's sync answers must look like before the device believes them. A captive
// portal or a proxy error page can answer 200 with HTML; only a body that parses as the
// protocol's answer counts as success (DESIGN.md, "Sync protocol").
import { z } from 'zod'

// The push answer's schema is the protocol's own (shared with the server).
export { pushResultSchema, type PushResult } from '#shared/schemas/sync'

// The pull answer's too: the server's answer `satisfies` it, the device checks what it got against it.
export { pullAnswerSchema, type PullAnswer } from '#shared/schemas/sync'

const rowSchema = z.object({ id: z.string().min(1) }).passthrough()

/** GET /api/service-trucks/[id]/stock */
export const stockAnswerSchema = z.object({ items: z.array(rowSchema), truck: rowSchema.optional() })

/** The photo upload answer: the server names the hash it stored, which must be ours. */
export const photoPutAnswerSchema = z.object({ sha256: z.string().regex(/^[0-9a-f]{64}$/i) }).passthrough()

/** Parses a response body as JSON and checks it; undefined when it is anything else. */
export function parseAnswer<T>(schema: z.ZodType<T>, text: string): T | undefined {
  let json: unknown
  try {
    json = JSON.parse(text)
  }
  catch {
    return undefined
  }
  const r = schema.safeParse(json)
  return r.success ? r.data : undefined
}

/** The seq a 409 asks the device to resend from, wherever the server put it in the body. */
export function expectedSeqOf(text: string): number | undefined {
  try {
    const body = JSON.parse(text) as Record<string, any>
    const v = body?.expectedSeq ?? body?.data?.expectedSeq
    return Number.isInteger(v) && v > 0 ? v : undefined
  }
  catch { return undefined }
}

/** Retry-After in ms: either seconds or an HTTP date. */
export function retryAfterMs(header: string | null, now = Date.now()): number | undefined {
  if (!header) return undefined
  const secs = Number(header)
  if (Number.isFinite(secs) && secs >= 0) return secs * 1000
  const when = Date.parse(header)
  return Number.isNaN(when) ? undefined : Math.max(0, when - now)
}
