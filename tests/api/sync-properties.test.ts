// Property tests of the whole protocol against the running server (fast-check): random
// interleavings of two devices of one mechanic and the office editing the same call, with
// duplicates, resends, lost answers (a crash after the commit) and lost requests (a crash before
// it), end with every record exactly once and every value a person typed either applied or kept
// in a conflict row; no op is refused and every seq is used once.
import fc from 'fast-check'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, count, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { cleanupSyncData, Device, makeCall, type TestOp } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

let mech1: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  mech1 = await signedIn(DEMO.mech1)
})

/** A phone: its outbox, the last seq the server confirmed, and what it believes the call's cause is. */
class Phone {
  readonly device: Device
  outbox: TestOp[] = []
  acked = 0
  known: string | null = null
  constructor() { this.device = new Device(mech1) }
}

type Step
  = | { kind: 'note', phone: 0 | 1, text: string }
    | { kind: 'cause', phone: 0 | 1, text: string }
    | { kind: 'office', text: string }
    | { kind: 'push', phone: 0 | 1, take: number, resend: number, lose: 'none' | 'answer' | 'request' }
    | { kind: 'twice', phone: 0 | 1 }
    | { kind: 'refresh', phone: 0 | 1 }

const phone = fc.constantFrom(0 as const, 1 as const)
const words = fc.string({ minLength: 1, maxLength: 12 }).map(s => s.replaceAll(String.fromCharCode(0), '').trim() || 'x')
const step: fc.Arbitrary<Step> = fc.oneof(
  fc.record({ kind: fc.constant('note' as const), phone, text: words }),
  fc.record({ kind: fc.constant('cause' as const), phone, text: words }),
  fc.record({ kind: fc.constant('office' as const), text: words }),
  fc.record({
    kind: fc.constant('push' as const), phone, take: fc.integer({ min: 1, max: 4 }), resend: fc.integer({ min: 0, max: 2 }),
    lose: fc.constantFrom('none' as const, 'answer' as const, 'request' as const),
  }),
  fc.record({ kind: fc.constant('twice' as const), phone }),
  fc.record({ kind: fc.constant('refresh' as const), phone }),
)

async function causeOf(callId: string): Promise<string | null> {
  return (await testPool().query('SELECT story_cause FROM calls WHERE id = $1', [callId])).rows[0].story_cause
}

/** Sends the phone's unconfirmed ops (after `resend` already confirmed ones), at most `take` new. */
async function push(p: Phone, take: number, resend: number, lose: 'none' | 'answer' | 'request') {
  const from = p.outbox.findIndex(o => o.seq > p.acked)
  if (from < 0 && !resend) return
  const start = Math.max(0, (from < 0 ? p.outbox.length : from) - resend)
  const batch = p.outbox.slice(start, (from < 0 ? p.outbox.length : from) + take)
  if (!batch.length || lose === 'request') return
  const r = await p.device.push(batch)
  expect(r.status).toBe(200)
  for (const res of r.body.results) expect(res.status, JSON.stringify(res)).not.toBe('rejected')
  if (lose === 'answer') return
  p.acked = Math.max(p.acked, r.body.lastSeq)
}

describe('the protocol, under random interleavings', () => {
  it('ends with every record once and every typed value applied or kept in a conflict', async () => {
    await fc.assert(fc.asyncProperty(fc.array(step, { minLength: 4, maxLength: 14 }), async (steps) => {
      const callId = await makeCall({ status: 'on_site' })
      const phones = [new Phone(), new Phone()] as const
      const notes: { id: string, text: string }[] = []
      const typed: { opId: string, text: string }[] = []
      for (const s of steps) {
        if (s.kind === 'note') {
          const op = phones[s.phone].device.op('note', { callId, text: s.text })
          phones[s.phone].outbox.push(op)
          notes.push({ id: op.entityId, text: s.text })
        }
        else if (s.kind === 'cause') {
          const p = phones[s.phone]
          const op = p.device.update('call', callId, { storyCause: s.text }, { storyCause: p.known })
          p.outbox.push(op)
          p.known = s.text
          typed.push({ opId: op.opId, text: s.text })
        }
        else if (s.kind === 'office') await testPool().query('UPDATE calls SET story_cause = $2 WHERE id = $1', [callId, s.text])
        else if (s.kind === 'push') await push(phones[s.phone], s.take, s.resend, s.lose)
        else if (s.kind === 'twice') {
          // Two tabs sending the same batch at once: one applies, the other finds it done.
          const p = phones[s.phone]
          const batch = p.outbox.filter(o => o.seq > p.acked)
          if (batch.length) {
            const rs = await Promise.all([p.device.push(batch), p.device.push(batch)])
            for (const r of rs) expect(r.status).toBe(200)
            p.acked = Math.max(p.acked, ...rs.map(r => r.body.lastSeq as number))
          }
        }
        else phones[s.phone].known = await causeOf(callId)
      }
      // Back in signal: each phone sends what it still holds, resending the last confirmed op too.
      for (const p of phones) {
        while (p.outbox.some(o => o.seq > p.acked)) await push(p, 500, 1, 'none')
      }

      for (const n of notes) {
        const rows = (await testPool().query('SELECT text FROM notes WHERE id = $1', [n.id])).rows
        expect(rows).toEqual([{ text: n.text }])
      }
      for (const p of phones) {
        const sql = 'SELECT seq, status FROM sync_ops WHERE client_id = $1 ORDER BY seq'
        const stored = (await testPool().query(sql, [p.device.clientId])).rows
        expect(stored.map(r => Number(r.seq))).toEqual(p.outbox.map(o => o.seq))
      }
      for (const t of typed) {
        const { rows: [op] } = await testPool().query('SELECT status FROM sync_ops WHERE op_id = $1', [t.opId])
        expect(['applied', 'conflict']).toContain(op.status)
        if (op.status === 'conflict') {
          const kept = await count('conflicts', `op_id = $1 AND device_value = to_jsonb($2::text)`, [t.opId, t.text])
          expect(kept).toBe(1)
        }
      }
      expect(await count('notes', 'call_id = $1', [callId])).toBe(notes.length)
    }), { numRuns: 12, endOnFailure: true })
  }, 240_000)
})
