import { describe, expect, it } from 'vitest'
import { isRetryableTxError, pgErrorCode, withTxRetry } from '~~/server/utils/sync/retry'

const pgError = (code: string) => Object.assign(new Error(`pg ${code}`), { code })
const noSleep = async () => {}

// SQLSTATE 40001 serialization_failure and 40P01 deadlock_detected: PostgreSQL documentation,
// Appendix A "PostgreSQL Error Codes".
describe('transaction retry', () => {
  it('runs the whole transaction again after a serialization failure or a deadlock', async () => {
    const codes = ['40001', '40P01']
    let runs = 0
    const out = await withTxRetry(async () => {
      runs++
      const code = codes.shift()
      if (code) throw pgError(code)
      return 'committed'
    }, { sleep: noSleep })
    expect(out).toBe('committed')
    expect(runs).toBe(3)
  })

  it('finds the code when drizzle wrapped the pg error', () => {
    const wrapped = Object.assign(new Error('Failed query'), { cause: pgError('40001') })
    expect(pgErrorCode(wrapped)).toBe('40001')
    expect(isRetryableTxError(wrapped)).toBe(true)
  })

  it('passes other errors through at once', async () => {
    let runs = 0
    await expect(withTxRetry(async () => {
      runs++
      throw pgError('23505')
    }, { sleep: noSleep })).rejects.toThrow('pg 23505')
    expect(runs).toBe(1)
  })

  it('gives up with 503 after the last attempt, never skipping silently', async () => {
    let runs = 0
    const waits: number[] = []
    await expect(withTxRetry(async () => {
      runs++
      throw pgError('40001')
    }, {
      attempts: 4,
      baseMs: 10,
      sleep: async (ms) => {
        waits.push(ms)
      },
    }))
      .rejects.toMatchObject({ statusCode: 503 })
    expect(runs).toBe(4)
    expect(waits).toHaveLength(3)
    // Backoff grows: each wait lies in [ceiling/2, 1.5·ceiling) with ceiling = 10, 20, 40 ms.
    waits.forEach((w, i) => {
      const c = 10 * 2 ** i
      expect(w).toBeGreaterThanOrEqual(c / 2)
      expect(w).toBeLessThan(1.5 * c)
    })
  })
})
