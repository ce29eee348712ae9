import { describe, expect, it } from 'vitest'
import { keepTrying, retryWaitMs } from '../../server/utils/keepTrying'

describe('keepTrying: starting the job queue while PostgreSQL comes up', () => {
  it('waits 1 s, 2 s, 4 s … between tries, never more than 30 s (doubling backoff, common practice)', () => {
    expect([0, 1, 2, 3, 4, 5, 6, 40].map(a => retryWaitMs(a))).toEqual([1000, 2000, 4000, 8000, 16000, 30000, 30000, 30000])
  })

  it('tries again after each failure and stops trying once the start works', async () => {
    const waits: number[] = []
    let tries = 0
    const started = await keepTrying(async () => {
      tries++
      if (tries < 4) throw new Error('connect ECONNREFUSED 127.0.0.1:5432')
    }, { isClosing: () => false, sleep: async (ms) => { waits.push(ms) } })
    expect(started).toBe(true)
    expect(tries).toBe(4)
    expect(waits).toEqual([1000, 2000, 4000])
  })

  it('reports each failure with the wait before the next try', async () => {
    const seen: string[] = []
    let tries = 0
    await keepTrying(async () => {
      if (tries++ === 0) throw new Error('the database system is starting up')
    }, { isClosing: () => false, sleep: async () => {}, onFailure: (err, ms) => seen.push(`${(err as Error).message} / ${ms}`) })
    expect(seen).toEqual(['the database system is starting up / 1000'])
  })

  it('gives up when the server closes, without trying again', async () => {
    let closing = false
    let tries = 0
    const started = await keepTrying(async () => {
      tries++
      throw new Error('down')
    }, { isClosing: () => closing, sleep: async () => { closing = true } })
    expect(started).toBe(false)
    expect(tries).toBe(1)
  })
})
