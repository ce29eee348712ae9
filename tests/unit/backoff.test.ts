import { describe, expect, it } from 'vitest'
import { BACKOFF_MAX_MS, BACKOFF_MIN_MS, backoffDelay, nextRetryDelay } from '../../app/utils/backoff'
import { retryAfterMs } from '../../app/utils/syncWire'

describe('backoffDelay: doubling from 1 s to 5 min with jitter', () => {
  it('follows the doubling schedule at the top of each window (random → 1)', () => {
    // Exponential backoff, doubling per attempt, capped (common practice; DESIGN.md asks 1 s … 5 min)
    const top = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10].map(a => backoffDelay(a, 1))
    expect(top).toEqual([1000, 2000, 4000, 8000, 16000, 32000, 64000, 128000, 256000, 300000, 300000])
  })

  it('jitters within the upper half of each window, never below 1 s', () => {
    expect(backoffDelay(0, 0)).toBe(1000)
    expect(backoffDelay(3, 0)).toBe(4000)
    expect(backoffDelay(3, 0.5)).toBe(6000)
    expect(backoffDelay(9, 0)).toBe(150000)
    for (let a = 0; a < 40; a++) {
      for (const r of [0, 0.13, 0.5, 0.87, 0.9999]) {
        const d = backoffDelay(a, r)
        expect(d).toBeGreaterThanOrEqual(BACKOFF_MIN_MS)
        expect(d).toBeLessThanOrEqual(BACKOFF_MAX_MS)
      }
    }
  })

  it('spreads phones that fail together', () => {
    const delays = new Set([0.05, 0.25, 0.45, 0.65, 0.85].map(r => backoffDelay(6, r)))
    expect(delays.size).toBe(5)
  })

  it('survives nonsense input', () => {
    expect(backoffDelay(-3, 0.5)).toBe(1000)
    expect(backoffDelay(Number.NaN, Number.NaN)).toBe(1000)
    expect(backoffDelay(1e9, 2)).toBe(BACKOFF_MAX_MS)
  })

  it('honours a longer Retry-After, in seconds or as an HTTP date', () => {
    // RFC 9110 §10.2.3: Retry-After is delay-seconds or an HTTP-date
    expect(retryAfterMs('120')).toBe(120_000)
    expect(retryAfterMs('Wed, 21 Oct 2026 07:28:30 GMT', Date.parse('Wed, 21 Oct 2026 07:28:00 GMT'))).toBe(30_000)
    expect(retryAfterMs('soon')).toBeUndefined()
    expect(nextRetryDelay(0, 0, 120_000)).toBe(120_000)
    expect(nextRetryDelay(8, 1, 5_000)).toBe(256_000) // the backoff is longer: keep it
    expect(nextRetryDelay(0, 0, 10 * 24 * 3600_000)).toBe(3600_000) // a broken header cannot park sync for days
  })
})
