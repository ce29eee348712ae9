import { describe, expect, it } from 'vitest'
import { expectedSeqOf, parseAnswer, pullAnswerSchema, pushResultSchema } from '../../app/utils/syncWire'

describe('push result validator', () => {
  it('accepts a push answer of the protocol', () => {
    const ok = parseAnswer(
      pushResultSchema, JSON.stringify({ lastSeq: 3, results: [{ opId: 'a', seq: 3, status: 'applied', version: 2 }] }),
    )
    expect(ok?.results[0]?.status).toBe('applied')
  })

  it('refuses a captive portal page answered with 200', () => {
    const portal = '<!doctype html><html><head><title>Sign in to the Wi-Fi</title></head><body><form>Accept terms</form></body></html>'
    expect(parseAnswer(pushResultSchema, portal)).toBeUndefined()
  })

  it('refuses JSON that is not a push answer', () => {
    expect(parseAnswer(pushResultSchema, '{"ok":true}')).toBeUndefined()
    expect(parseAnswer(pushResultSchema, '{"lastSeq":1,"results":[{"opId":"a","seq":1,"status":"maybe"}]}')).toBeUndefined()
    expect(parseAnswer(pushResultSchema, '')).toBeUndefined()
    expect(parseAnswer(pushResultSchema, 'null')).toBeUndefined()
  })

  it('refuses a portal page in place of a pull answer too', () => {
    expect(parseAnswer(pullAnswerSchema, '<html>Welcome to Truck Stop Wi-Fi</html>')).toBeUndefined()
    const ok = parseAnswer(
      pullAnswerSchema, JSON.stringify({ cursor: '9', lastSeq: 0, changes: { calls: [{ id: 'x' }] }, conflicts: [], revokedCallIds: [] }),
    )
    expect(ok?.changes.calls).toHaveLength(1)
    expect(ok?.changes.readings).toEqual([])
  })

  it('reads the expected seq of a 409 wherever the server put it', () => {
    expect(expectedSeqOf('{"expectedSeq":7}')).toBe(7)
    expect(expectedSeqOf('{"statusCode":409,"data":{"expectedSeq":12}}')).toBe(12)
    expect(expectedSeqOf('<html>')).toBeUndefined()
  })
})
