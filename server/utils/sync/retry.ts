// Passing failures (a serialization failure or a deadlock) roll the whole transaction back; it is
// run again from the start after a short, jittered wait. Nothing is ever skipped.
import { createError } from 'h3'

const RETRYABLE = new Set(['40001', '40P01'])

/** The SQLSTATE of a pg error, also when drizzle wrapped it (DrizzleQueryError.cause). */
export function pgErrorCode(err: unknown): string | undefined {
  for (let e = err as { code?: unknown, cause?: unknown } | undefined, depth = 0; e && depth < 5; e = e.cause as typeof e, depth++) {
    if (typeof e.code === 'string' && /^[0-9A-Z]{5}$/.test(e.code)) return e.code
  }
  return undefined
}

export function isRetryableTxError(err: unknown): boolean {
  const code = pgErrorCode(err)
  return code !== undefined && RETRYABLE.has(code)
}

export interface RetryOptions {
  attempts?: number
  baseMs?: number
  sleep?: (ms: number) => Promise<void>
  onRetry?: (attempt: number, err: unknown) => void
}

const wait = (ms: number) => new Promise<void>(resolve => setTimeout(resolve, ms))

export async function withTxRetry<T>(run: () => Promise<T>, opts: RetryOptions = {}): Promise<T> {
  const attempts = opts.attempts ?? 8
  const baseMs = opts.baseMs ?? 10
  const sleep = opts.sleep ?? wait
  for (let attempt = 1; ; attempt++) {
    try {
      return await run()
    }
    catch (err) {
      if (!isRetryableTxError(err)) throw err
      if (attempt >= attempts) {
        // Still contended after every retry: the device backs off and sends the same ops again.
        throw createError({ status: 503, statusText: 'Busy, try again shortly', data: { retryAfter: 2 }, cause: err })
      }
      opts.onRetry?.(attempt, err)
      const ceiling = baseMs * 2 ** (attempt - 1)
      await sleep(ceiling / 2 + Math.random() * ceiling)
    }
  }
}
