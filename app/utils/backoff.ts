// How long the sync engine waits after a failed attempt: doubling from 1 s up to 5 min, with
// jitter so a yard full of phones coming back into signal together do not all retry at once.

export const BACKOFF_MIN_MS = 1000
export const BACKOFF_MAX_MS = 5 * 60 * 1000
/** A server's Retry-After is honoured, but never past this (a broken header must not park sync for days). */
export const RETRY_AFTER_MAX_MS = 60 * 60 * 1000

/**
 * Delay before retry number `attempt` (0 for the first retry). `random` in [0, 1) picks a point in
 * the upper half of the doubling window, so the delay stays within 1 s … 5 min and still spreads.
 */
export function backoffDelay(attempt: number, random: number): number {
  if (!Number.isFinite(attempt) || attempt < 0) attempt = 0
  const r = Math.min(Math.max(Number.isFinite(random) ? random : 0, 0), 1)
  const ceiling = Math.min(BACKOFF_MAX_MS, BACKOFF_MIN_MS * 2 ** Math.min(Math.floor(attempt), 30))
  return Math.round(Math.min(BACKOFF_MAX_MS, Math.max(BACKOFF_MIN_MS, ceiling * (0.5 + r / 2))))
}

/**
 * The backoff delay, or the server's Retry-After when that asks for longer. (`askedMs`, not the
 * name syncWire.ts exports: Nuxt's auto-import would pull that file, and its schemas, in here.)
 */
export function nextRetryDelay(attempt: number, random: number, askedMs?: number): number {
  const d = backoffDelay(attempt, random)
  if (askedMs === undefined || !Number.isFinite(askedMs)) return d
  return Math.max(d, Math.min(RETRY_AFTER_MAX_MS, askedMs))
}
