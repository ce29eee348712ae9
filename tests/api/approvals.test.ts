// The fleet's approval of a roadside estimate: the mechanic's request through sync, the office's
// record of a phone answer, the fleet's link (tampered, expired, reused), a decline and the choice
// after it, parallel answers, roles and bad input; the limit and PO on the call after each.
import { createHash } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, count, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { waitForMail } from '../support/mail'
import { callRow, cleanupSyncData, Device, makeCall, pullUntil } from '../support/sync'

const anonymous = new ApiClient()
let mech: Awaited<ReturnType<typeof signedIn>>
let mech2: Awaited<ReturnType<typeof signedIn>>
let dispatcher: Awaited<ReturnType<typeof signedIn>>
let office: Awaited<ReturnType<typeof signedIn>>

beforeAll(async () => {
  ;[mech, mech2, dispatcher, office] = await Promise.all([
    signedIn(DEMO.mech1), signedIn(DEMO.mech2), signedIn(DEMO.dispatcher), signedIn(DEMO.office)])
})
afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

/** A call on site with a $1,500 limit and a PO, as dispatch takes one. */
async function callWithLimit() {
  const id = await makeCall({ status: 'on_site' })
  await testPool().query(`UPDATE calls SET auth_limit_cents = 150000, po_number = 'PF-1001' WHERE id = $1`, [id])
  return id
}

const request = (callId: string, extra: Record<string, unknown> = {}) => ({
  callId, diagnosis: 'Coolant temperature sensor reads open; connector corroded', needed: 'Sensor, pigtail, 1.5 h',
  plannedLaborMinutes: 90, plannedParts: [{ partNumber: 'TR-ECT-10K', description: 'Coolant temperature sensor', quantity: 1,
    unitPriceCents: 12000 }], estimateCents: 248_750, limitCents: 150000, ...extra,
})

/** The mechanic asks through sync, as the phone's outbox does; answers the request id. */
async function ask(callId: string, extra: Record<string, unknown> = {}) {
  const d = new Device(mech)
  const op = d.op('approvalRequest', request(callId, extra))
  const r = await d.push([op])
  expect(r.status).toBe(200)
  expect(r.body.results[0]).toMatchObject({ status: 'applied' })
  return op.entityId
}

const approve = (callId: string, body: Record<string, unknown>) => dispatcher.post(`/api/calls/${callId}/approvals`, {
  decision: 'approved', approvedBy: 'Pat Ruiz', amountCents: 250000, poNumber: 'PF-2002', channel: 'phone', ...body,
})

describe('approval requests through sync', () => {
  it('a request pushed from the phone waits on the call; the office sees it and the board raises it', async () => {
    const callId = await callWithLimit()
    const requestId = await ask(callId)
    const rec = await dispatcher.get(`/api/calls/${callId}`)
    expect(rec.status).toBe(200)
    expect(rec.body.awaitingApproval).toBe(true)
    expect(rec.body.approvalRequests).toHaveLength(1)
    expect(rec.body.approvalRequests[0]).toMatchObject({ id: requestId, open: true, estimateCents: 248_750, plannedLaborMinutes: 90 })
    expect(rec.body.approvals).toEqual([])
  })

  it('a request the schema refuses is rejected naming the field; another mechanic\'s call is forbidden', async () => {
    const callId = await callWithLimit()
    const d = new Device(mech)
    const bad = d.op('approvalRequest', request(callId, { diagnosis: '', estimateCents: -5 }))
    const r = await d.push([bad])
    expect(r.body.results[0].status).toBe('rejected')
    expect(r.body.results[0].reason).toMatch(/diagnosis/)
    expect(r.body.results[0].reason).toMatch(/estimateCents/)
    const d2 = new Device(mech2)
    const theirs = await d2.push([d2.op('approvalRequest', request(callId))])
    expect(theirs.body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/forbidden|not assigned/i) })
    expect(await count('approval_requests', 'call_id = $1', [callId])).toBe(0)
  })
})

describe('POST /api/calls/[id]/approvals', () => {
  it('mechanics may not record an answer (403); without a session 401', async () => {
    const callId = await callWithLimit()
    expect((await mech.post(`/api/calls/${callId}/approvals`, { decision: 'approved', approvedBy: 'x', amountCents: 1, channel: 'phone' }))
      .status).toBe(403)
    expect((await anonymous.post(`/api/calls/${callId}/approvals`, {})).status).toBe(401)
    expect(await count('approvals', 'call_id = $1', [callId])).toBe(0)
  })

  it('bad input answers 400 naming the field, and nothing is written', async () => {
    const callId = await callWithLimit()
    const cases: [Record<string, unknown>, string][] = [
      [{ decision: 'maybe' }, 'decision'],
      [{ approvedBy: '' }, 'approvedBy'],
      [{ amountCents: '2500' }, 'amountCents'],
      [{ amountCents: 12.5 }, 'amountCents'],
      [{ amountCents: -1 }, 'amountCents'],
      [{ channel: 'fax' }, 'channel'],
      [{ poNumber: 'A\u0000B' }, 'poNumber'],
      [{ amountCents: 0 }, 'amountCents'],
    ]
    for (const [body, field] of cases) {
      const r = await approve(callId, body)
      expect(r.status, JSON.stringify(body)).toBe(400)
      expect(Object.keys(r.body.data.fields)).toContain(field)
    }
    expect((await dispatcher.post('/api/calls/not-a-uuid/approvals', {})).status).toBe(400)
    expect(await count('approvals', 'call_id = $1', [callId])).toBe(0)
    expect((await callRow(callId)).auth_limit_cents).toBe(150000)
  })

  it('an approval by phone answers the request, raises the limit and sets the PO; GET lists approvals newest last', async () => {
    const callId = await callWithLimit()
    const requestId = await ask(callId)
    const r = await approve(callId, {})
    expect(r.status).toBe(201)
    expect(r.body.call).toMatchObject({ authLimitCents: 250000, poNumber: 'PF-2002' })
    expect(r.body.approval).toMatchObject({ decision: 'approved', approvedBy: 'Pat Ruiz', channel: 'phone', requestId,
      previousLimitCents: 150000, previousPoNumber: 'PF-1001' })
    const row = await callRow(callId)
    expect(row.auth_limit_cents).toBe(250000)
    expect(row.po_number).toBe('PF-2002')
    // A second, larger approval later (no request open): recorded, newest last.
    const more = await approve(callId, { amountCents: 310000, poNumber: null, approvedBy: 'Pat Ruiz', channel: 'email' })
    expect(more.status).toBe(201)
    const rec = await office.get(`/api/calls/${callId}`)
    expect(rec.body.awaitingApproval).toBe(false)
    expect(rec.body.approvals.map((a: { amountCents: number }) => a.amountCents)).toEqual([250000, 310000])
    expect(rec.body.approvals[0].recordedByPerson.name).toEqual(expect.any(String))
    expect(rec.body.authLimitCents).toBe(310000)
    // No PO given: the call keeps the one it had.
    expect(rec.body.poNumber).toBe('PF-2002')
    const events = rec.body.events.filter((e: { kind: string }) => e.kind === 'approval_approved')
    expect(events).toHaveLength(2)
    expect(events[0].note).toMatch(/Pat Ruiz by phone/)
  })

  it('a decline leaves the limit and PO; the mechanic\'s choice after it is recorded on the call through sync', async () => {
    const callId = await callWithLimit()
    await ask(callId)
    const r = await approve(callId, { decision: 'declined', amountCents: 248_750, poNumber: null })
    expect(r.status).toBe(201)
    expect(r.body.call).toMatchObject({ authLimitCents: 150000, poNumber: 'PF-1001' })
    const d = new Device(mech)
    const choice = await d.push([d.update('call', callId, { afterDecline: 'make_safe_release' }, { afterDecline: null })])
    expect(choice.body.results[0].status).toBe('applied')
    expect((await callRow(callId)).after_decline).toBe('make_safe_release')
    const bad = await d.push([d.update('call', callId, { afterDecline: 'abandon' }, { afterDecline: 'make_safe_release' })])
    expect(bad.body.results[0]).toMatchObject({ status: 'rejected', reason: expect.stringMatching(/afterDecline/) })
    const rec = await dispatcher.get(`/api/calls/${callId}`)
    expect(rec.body.approvals).toHaveLength(1)
    expect(rec.body.approvals[0]).toMatchObject({ decision: 'declined', amountCents: 248_750 })
    expect(rec.body.afterDecline).toBe('make_safe_release')
  })

  it('two answers at once to the same request: the call row is locked, one applies and the other is refused', async () => {
    const callId = await callWithLimit()
    const requestId = await ask(callId)
    const [a, b] = await Promise.all([
      approve(callId, { amountCents: 260000, poNumber: 'PF-A', requestId }),
      approve(callId, { amountCents: 270000, poNumber: 'PF-B', requestId }),
    ])
    expect([a.status, b.status].sort()).toEqual([201, 409])
    const won = a.status === 201 ? a : b
    const row = await callRow(callId)
    expect(row.auth_limit_cents).toBe(won.body.call.authLimitCents)
    expect(row.po_number).toBe(won.body.call.poNumber)
    expect(await count('approvals', 'call_id = $1', [callId])).toBe(1)
    // The same answer twice (a double click with no request named) is refused too.
    const [c, d] = await Promise.all([approve(callId, { amountCents: 280000 }), approve(callId, { amountCents: 280000 })])
    expect([c.status, d.status].sort()).toEqual([201, 409])
  })

  it('a billed or cancelled call takes no answer (422 status)', async () => {
    const callId = await makeCall({ status: 'cancelled' })
    const r = await approve(callId, {})
    expect(r.status).toBe(422)
    expect(r.body.data.fields).toHaveProperty('status')
  })
})

describe('the fleet\'s approval link', () => {
  const tokenOf = (url: string) => url.split('/a/')[1]!

  it('only the office makes one, for an open request; the fleet sees the request and the estimate without an account', async () => {
    const callId = await callWithLimit()
    expect((await dispatcher.post(`/api/calls/${callId}/approval-link`, {})).status).toBe(422)
    await ask(callId)
    expect((await mech.post(`/api/calls/${callId}/approval-link`, {})).status).toBe(403)
    expect((await dispatcher.post(`/api/calls/${callId}/approval-link`, { sendTo: 'not an address' })).body.data.fields)
      .toHaveProperty('sendTo')
    const made = await dispatcher.post(`/api/calls/${callId}/approval-link`, {})
    expect(made.status).toBe(200)
    expect(made.body.url).toMatch(/\/a\/[\w-]{43}$/)
    const token = tokenOf(made.body.url)
    // Only the hash is kept.
    const hash = createHash('sha256').update(token).digest('hex')
    expect(await count('links', `token_hash = $1 AND purpose = 'estimate_approval'`, [hash])).toBe(1)
    expect(await count('links', 'token_hash = $1', [token])).toBe(0)
    const view = await anonymous.get(`/api/approve/${token}`)
    expect(view.status).toBe(200)
    expect(view.body.request).toMatchObject({ diagnosis: expect.stringMatching(/Coolant/), estimateCents: 248_750, plannedLaborMinutes: 90 })
    expect(view.body.limitCents).toBe(150000)
    expect(view.body.estimate.lines.some((l: { planned: boolean }) => l.planned)).toBe(true)
    expect(view.body.estimate.totalCents).toBeGreaterThan(0)
  })

  it('refuses tampered and expired links with the same 404; a used link is refused after the answer', async () => {
    const callId = await callWithLimit()
    await ask(callId)
    const made = await office.post(`/api/calls/${callId}/approval-link`, { sendTo: 'ops@prairie-freight.test' })
    expect(made.status).toBe(200)
    const [mail] = await waitForMail(m => m.to.join(' ').includes('ops@prairie-freight.test') && m.text.includes(made.body.url))
    expect(mail?.subject).toMatch(/approval needed/)
    const token = tokenOf(made.body.url)
    const tampered = `${token.slice(0, -1)}${token.endsWith('A') ? 'B' : 'A'}`
    const refused = await anonymous.get(`/api/approve/${tampered}`)
    expect(refused.status).toBe(404)
    const answerTampered = await anonymous.post(`/api/approve/${tampered}`, { decision: 'approved', approvedBy: 'Someone', poNumber: 'X' })
    expect(answerTampered.status).toBe(404)
    expect((await anonymous.get('/api/approve/short')).status).toBe(404)

    // Bad input on a good link: 400 naming the field, nothing written.
    const bad = await anonymous.post(`/api/approve/${token}`, { decision: 'approved', approvedBy: '' })
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields).toHaveProperty('approvedBy')

    const ok = await anonymous.post(`/api/approve/${token}`, { decision: 'approved', approvedBy: 'Dana Whitfield', poNumber: 'PF-7781' })
    expect(ok.status).toBe(201)
    expect(ok.body).toMatchObject({ decision: 'approved', amountCents: 248_750, poNumber: 'PF-7781' })
    const row = await callRow(callId)
    expect(row.auth_limit_cents).toBe(248_750)
    expect(row.po_number).toBe('PF-7781')
    const rec = await dispatcher.get(`/api/calls/${callId}`)
    expect(rec.body.approvals.at(-1)).toMatchObject({ channel: 'link', approvedBy: 'Dana Whitfield', recordedBy: null })

    // Used: refused to read and to answer again.
    expect((await anonymous.get(`/api/approve/${token}`)).status).toBe(404)
    const again = await anonymous.post(`/api/approve/${token}`, { decision: 'declined', approvedBy: 'Someone else' })
    expect(again.status).toBe(404)
    expect(await count('approvals', 'call_id = $1', [callId])).toBe(1)
    expect((await callRow(callId)).auth_limit_cents).toBe(248_750)

    // Expired: a new request and link, run out.
    await ask(callId, { estimateCents: 300000, limitCents: 248_750 })
    const next = await dispatcher.post(`/api/calls/${callId}/approval-link`, {})
    const t2 = tokenOf(next.body.url)
    await testPool().query(`UPDATE links SET expires_at = now() - interval '1 second' WHERE token_hash = $1`,
      [createHash('sha256').update(t2).digest('hex')])
    expect((await anonymous.get(`/api/approve/${t2}`)).status).toBe(404)
    expect((await anonymous.post(`/api/approve/${t2}`, { decision: 'approved', approvedBy: 'Dana', poNumber: 'Z' })).status).toBe(404)
    expect((await callRow(callId)).auth_limit_cents).toBe(248_750)
  })

  it('a decline from the link keeps the limit; an answer recorded by the office closes the link', async () => {
    const callId = await callWithLimit()
    await ask(callId)
    const first = tokenOf((await dispatcher.post(`/api/calls/${callId}/approval-link`, {})).body.url)
    const r = await anonymous.post(`/api/approve/${first}`, { decision: 'declined', approvedBy: 'Dana Whitfield' })
    expect(r.status).toBe(201)
    expect((await callRow(callId)).auth_limit_cents).toBe(150000)

    await ask(callId)
    const second = tokenOf((await dispatcher.post(`/api/calls/${callId}/approval-link`, {})).body.url)
    expect((await approve(callId, { amountCents: 260000 })).status).toBe(201)
    expect((await anonymous.get(`/api/approve/${second}`)).status).toBe(404)
  })

  it('the phone learns the new limit and the answer on its next pull', async () => {
    const callId = await callWithLimit()
    await ask(callId)
    const d = new Device(mech)
    const first = await pullUntil(d, undefined, seen => (seen.calls ?? []).some(c => c.id === callId))
    expect((first.seen.calls ?? []).find(c => c.id === callId)).toMatchObject({ authLimitCents: 150000 })
    expect((first.seen.approvalRequests ?? []).some(r => (r as unknown as { callId: string }).callId === callId)).toBe(true)
    await approve(callId, { amountCents: 255000, poNumber: 'PF-3003' })
    const ofCall = (a: unknown) => (a as { callId: string }).callId === callId
    const next = await pullUntil(d, first.cursor, seen => (seen.approvals ?? []).some(ofCall))
    expect((next.seen.calls ?? []).find(c => c.id === callId)).toMatchObject({ authLimitCents: 255000, poNumber: 'PF-3003' })
    expect((next.seen.approvals ?? []).find(a => (a as unknown as { callId: string }).callId === callId))
      .toMatchObject({ decision: 'approved', amountCents: 255000, approvedBy: 'Pat Ruiz' })
  })
})
