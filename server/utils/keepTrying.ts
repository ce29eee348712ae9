// Starting something that needs another service (the job queue needs PostgreSQL): an app server
// may come up before its database, so the start is tried again with doubling waits until it works
// or the server closes, instead of leaving mail unworked until someone restarts the process.

export type KeepTryingOptions = {
  /** True once the server is closing: stop trying. */
  isClosing: () => boolean
  /** The first wait; each failure doubles it up to `maxWaitMs`. */
  firstWaitMs?: number
  maxWaitMs?: number
  /** Waits `ms` (a timer in the server, instant in tests). */
  sleep?: (ms: number) => Promise<void>
  onFailure?: (err: unknown, waitMs: number, attempt: number) => void
}

/** The waits between tries: 1 s, 2 s, 4 s … capped. */
export function retryWaitMs(attempt: number, firstWaitMs = 1000, maxWaitMs = 30_000) {
  return Math.min(maxWaitMs, firstWaitMs * 2 ** Math.min(attempt, 30))
}

/** Runs `start` until it resolves (true) or the server closes (false). */
export async function keepTrying(start: () => Promise<void>, o: KeepTryingOptions): Promise<boolean> {
  const sleep = o.sleep ?? (ms => new Promise<void>(resolve => setTimeout(resolve, ms).unref()))
  for (let attempt = 0; !o.isClosing(); attempt++) {
    try {
      await start()
      return true
    }
    catch (err) {
      const waitMs = retryWaitMs(attempt, o.firstWaitMs, o.maxWaitMs)
      o.onFailure?.(err, waitMs, attempt)
      await sleep(waitMs)
    }
  }
  return false
}
