// Deep pages without offsets: the calls list's keyset cursor (`next` / `after`) walks the same calls
// as page numbers do, and a unit's history comes a page at a time (`moreCalls` / `before`), with a
// comeback flagged across a page's edge. Bad cursors answer 400 naming the field.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { seedId } from '../../server/db/seed/ids'

afterAll(closeTestPool)

let dispatcher: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  dispatcher = await signedIn(DEMO.dispatcher)
})

type ListAnswer = { items: { id: string, number: number }[], total: number, next: string | null }

describe('GET /api/calls by cursor', () => {
  it('walks every call once, in the same order as the pages, for each sort', async () => {
    for (const sort of ['receivedAt', 'number', 'status', 'statusChangedAt']) {
      for (const dir of ['asc', 'desc']) {
        const byPage: string[] = []
        const first = await dispatcher.get<ListAnswer>(`/api/calls?sort=${sort}&dir=${dir}&pageSize=4`)
        expect(first.status).toBe(200)
        const pages = Math.ceil(first.body.total / 4)
        for (let p = 1; p <= pages; p++) {
          const page = await dispatcher.get<ListAnswer>(`/api/calls?sort=${sort}&dir=${dir}&pageSize=4&page=${p}`)
          byPage.push(...page.body.items.map(c => c.id))
        }
        const byCursor: string[] = []
        let answer = first.body
        for (;;) {
          byCursor.push(...answer.items.map(c => c.id))
          if (!answer.next) break
          answer = (await dispatcher.get<ListAnswer>(`/api/calls?sort=${sort}&dir=${dir}&pageSize=4&after=${answer.next}`)).body
        }
        expect(byCursor, `${sort} ${dir}`).toEqual(byPage)
        expect(new Set(byCursor).size).toBe(first.body.total)
      }
    }
  })

  it('answers 400 naming `after` for a cursor it did not give', async () => {
    for (const after of ['nonsense', Buffer.from('["yesterday", 3]').toString('base64url'), Buffer.from('{"a":1}').toString('base64url')]) {
      const r = await dispatcher.get(`/api/calls?after=${after}`)
      expect(r.status, after).toBe(400)
      expect(JSON.stringify(r.body)).toContain('after')
    }
  })

  it('finds a call by a word of its complaint, its customer, its unit and its number', async () => {
    const c1 = seedId('call:c1')
    const { rows: [c] } = await testPool().query('SELECT number FROM calls WHERE id = $1', [c1])
    for (const q of ['will not pull', 'Prairie', 'PCH-88121', String(c.number)]) {
      const r = await dispatcher.get<ListAnswer>(`/api/calls?q=${encodeURIComponent(q)}&pageSize=200`)
      expect(r.status, q).toBe(200)
      expect(r.body.items.map(i => i.id), q).toContain(c1)
      expect(r.body.total, q).toBe(r.body.items.length)
    }
    // A wildcard is taken as typed.
    expect((await dispatcher.get<ListAnswer>('/api/calls?q=%25')).body.total).toBe(0)
  })
})

describe('GET /api/units/[id] by pages', () => {
  const unitId = seedId('unit:3')
  const DAY = 86_400_000
  const made: string[] = []
  beforeAll(async () => {
    // 45 finished calls on one unit, a day apart, older than the demo's.
    const { rows: [u] } = await testPool().query('SELECT customer_id FROM units WHERE id = $1', [unitId])
    for (let i = 0; i < 45; i++) {
      const id = randomUUID()
      made.push(id)
      await testPool().query(`INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, complaint, received_at)
        VALUES ($1, 'completed', 'repaired', $2, $3, 'Paging lot', 'Paging check ' || $4::int, $5)`,
      [id, u.customer_id, unitId, i, new Date(Date.now() - (400 + i) * DAY)])
    }
  })

  it('answers the newest 20 with a cursor, and the older pages after it, each call once', async () => {
    const first = await dispatcher.get(`/api/units/${unitId}`)
    expect(first.status).toBe(200)
    expect(first.body.calls).toHaveLength(20)
    expect(first.body.callCount).toBeGreaterThanOrEqual(45)
    const seen: string[] = first.body.calls.map((c: { id: string }) => c.id)
    let more = first.body.moreCalls as string | null
    let pages = 1
    while (more) {
      const next = await dispatcher.get(`/api/units/${unitId}?before=${more}`)
      expect(next.status).toBe(200)
      seen.push(...next.body.calls.map((c: { id: string }) => c.id))
      more = next.body.moreCalls
      pages++
    }
    expect(pages).toBe(Math.ceil(first.body.callCount / 20))
    expect(new Set(seen).size).toBe(first.body.callCount)
    for (const id of made) expect(seen).toContain(id)
    // Newest first across pages.
    const times = (await testPool().query('SELECT id, received_at FROM calls WHERE id = ANY($1)', [seen])).rows
    const at = new Map(times.map(r => [r.id, new Date(r.received_at).getTime()]))
    expect(seen.map(id => at.get(id)!)).toEqual([...seen.map(id => at.get(id)!)].sort((a, b) => b - a))
  })

  it('flags a comeback whose calls sit on two pages, on both pages', async () => {
    const ids = (c: { id: string }[]) => c.map(x => x.id)
    const page1 = (await dispatcher.get(`/api/units/${unitId}`)).body
    const page2 = (await dispatcher.get(`/api/units/${unitId}?before=${page1.moreCalls}`)).body
    const later = page1.calls.at(-1).id as string
    const earlier = page2.calls[0].id as string
    expect(made).toContain(later)
    expect(made).toContain(earlier)
    // The same code on both (a day apart, well within the comeback window).
    for (const id of [later, earlier]) await testPool().query(`INSERT INTO fault_codes (call_id, spn, fmi) VALUES ($1, 110, 3)`, [id])
    const again1 = (await dispatcher.get(`/api/units/${unitId}`)).body
    const again2 = (await dispatcher.get(`/api/units/${unitId}?before=${again1.moreCalls}`)).body
    expect(ids(again1.calls)).toEqual(ids(page1.calls))
    const laterCall = again1.calls.at(-1)
    const earlierCall = again2.calls[0]
    expect(laterCall.comebacks.map((x: { earlierCallId: string }) => x.earlierCallId)).toEqual([earlier])
    expect(laterCall.comebacks[0].earlierNumber).toBe(earlierCall.number)
    expect(earlierCall.repeatedBy.map((x: { callId: string }) => x.callId)).toEqual([later])
  })

  it('answers 400 naming `before` for a cursor it did not give', async () => {
    const r = await dispatcher.get(`/api/units/${unitId}?before=not-a-cursor`)
    expect(r.status).toBe(400)
    expect(JSON.stringify(r.body)).toContain('before')
  })
})
