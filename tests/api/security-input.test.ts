// Input that cannot hurt: bodies capped by route before they are read (413), control characters
// and odd dates answered 400 naming the field with nothing written, canonical photo ids, and a
// mechanic's view of a call without the customer's billing details.
import { randomUUID } from 'node:crypto'
import http from 'node:http'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, count } from '../support/db'
import { BASE_URL, DEMO } from '../support/env'
import { ownServerPort, startOwnServer, type OwnServer } from '../support/server'
import { cleanupSyncData, Device, IDS, jpegBytes, makeCall, sha256 } from '../support/sync'

afterAll(async () => {
  await cleanupSyncData()
  await closeTestPool()
})

let dispatcher: Awaited<ReturnType<typeof signedIn>>
let admin: Awaited<ReturnType<typeof signedIn>>
let office: Awaited<ReturnType<typeof signedIn>>
let mech1: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  ;[dispatcher, admin, office, mech1] = await Promise.all([DEMO.dispatcher, DEMO.admin, DEMO.office, DEMO.mech1].map(signedIn))
})

type Sent = { status: number, headers: http.IncomingHttpHeaders, body: string, bytesSent: number }
type StreamOpts = { total: number, chunked: boolean, cookie?: string, method?: string, type?: string }

/**
 * Streams `total` bytes as a chunked body (or with a declared length), writing only as fast as the
 * server reads, and stops writing once the answer has come. Reports how much was sent by then.
 */
function stream(base: string, path: string, opts: StreamOpts): Promise<Sent> {
  const url = new URL(path, base)
  return new Promise((resolve, reject) => {
    let bytesSent = 0
    let answered = false
    const headers: Record<string, string> = { 'content-type': opts.type ?? 'application/json', 'x-wayside': '1' }
    if (opts.cookie) headers.cookie = opts.cookie
    if (!opts.chunked) headers['content-length'] = String(opts.total)
    const req = http.request(url, { method: opts.method ?? 'POST', headers, agent: false })
    req.on('response', (res) => {
      answered = true
      let body = ''
      res.setEncoding('utf8')
      res.on('data', (d: string) => {
        body += d
      })
      res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body, bytesSent }))
    })
    req.on('error', (err) => {
      if (!answered) reject(err)
    })
    const chunk = Buffer.alloc(64 * 1024, 0x20)
    const pump = () => {
      while (!answered && bytesSent < opts.total) {
        const piece = opts.total - bytesSent >= chunk.length ? chunk : chunk.subarray(0, opts.total - bytesSent)
        bytesSent += piece.length
        if (!req.write(piece)) {
          req.once('drain', pump)
          return
        }
      }
      if (answered) req.destroy()
      else req.end()
    }
    pump()
  })
}

const MB = 1024 * 1024

describe('body caps, by route, before reading', () => {
  it.each([
    ['sign-in', '/api/auth/login', 5 * 1024],
    ['an office JSON route', '/api/customers', 1.2 * MB],
    ['the sync push', '/api/sync/push', 2.2 * MB],
    ['the payment webhook', '/api/payments/webhook', 300 * 1024],
  ])('refuses %s over its cap with 413, declared or chunked', async (_what, path, size) => {
    const declared = await stream(BASE_URL, path, { total: Math.round(size), chunked: false, cookie: dispatcher.cookie })
    expect(declared.status).toBe(413)
    expect(JSON.parse(declared.body).requestId).toBeTruthy()
    const chunked = await stream(BASE_URL, path, { total: Math.round(size), chunked: true, cookie: dispatcher.cookie })
    expect(chunked.status).toBe(413)
  })

  it('refuses photo bytes over the photo limit, streamed without a length', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const bytes = jpegBytes(100)
    const op = d.op('photo', { callId, sha256: sha256(bytes), contentType: 'image/jpeg', sizeBytes: bytes.length })
    expect((await d.push([op])).body.results[0].status).toBe('applied')
    const opts = { total: 11 * MB, chunked: true, cookie: mech1.cookie, method: 'PUT', type: 'image/jpeg' }
    const r = await stream(BASE_URL, `/api/photos/${op.entityId}`, opts)
    expect(r.status).toBe(413)
  })

  it('still takes bodies under the cap sent chunked, on an office route and on the sync push', async () => {
    const name = `Chunked Haulage ${randomUUID().slice(0, 6)}`
    const res = await fetch(`${BASE_URL}/api/customers`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-wayside': '1', 'cookie': dispatcher.cookie },
      body: new Blob([JSON.stringify({ name, billingTerms: 'card' })]).stream(),
      duplex: 'half',
    } as RequestInit)
    expect(res.status).toBe(201)
    const d = new Device(mech1)
    const callId = await makeCall()
    const push = await fetch(`${BASE_URL}/api/sync/push`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-wayside': '1', 'cookie': mech1.cookie },
      body: new Blob([JSON.stringify({ clientId: d.clientId, ops: [d.op('note', { callId, text: 'Sent chunked' })] })]).stream(),
      duplex: 'half',
    } as RequestInit)
    expect(push.status).toBe(200)
    expect((await push.json()).results[0].status).toBe('applied')
  })

  describe('on a server of its own, watching its memory', () => {
    let server: OwnServer
    beforeAll(async () => {
      server = await startOwnServer(ownServerPort(7))
    })
    afterAll(async () => {
      await server?.kill('SIGTERM')
    })

    it('cuts sixteen simultaneous 150 MB sign-in bodies off early and stays small', async () => {
      const before = server.rssKb()
      const answers = await Promise.all(Array.from({ length: 16 }, () =>
        stream(server.url, '/api/auth/login', { total: 150 * MB, chunked: true })))
      for (const a of answers) {
        expect(a.status).toBe(413)
        // Cut off long before the end: the server stopped reading.
        expect(a.bytesSent).toBeLessThan(20 * MB)
      }
      const declared = await Promise.all(Array.from({ length: 16 }, () =>
        stream(server.url, '/api/auth/login', { total: 150 * MB, chunked: false })))
      for (const a of declared) {
        expect(a.status).toBe(413)
        expect(a.bytesSent).toBeLessThan(20 * MB)
      }
      // Well under one such body: nothing was buffered.
      expect(server.peakRssKb() - before).toBeLessThan(100 * 1024)
      expect((await fetch(`${server.url}/api/health`)).status).toBe(200)
    })
  })
})

describe('control characters answer 400 naming the field, and nothing is written', () => {
  const NUL = '\u0000'

  it('a customer (dispatch)', async () => {
    const before = await count('customers')
    const r = await dispatcher.post('/api/customers', { name: `Bad${NUL}Name`, billingTerms: 'card' })
    expect(r.status).toBe(400)
    expect(r.body.data.fields.name).toMatch(/control character/)
    const notes = await dispatcher.post('/api/customers', { name: 'Fine Name', billingTerms: 'card', notes: `line one\nline two\u0007` })
    expect(notes.status).toBe(400)
    expect(Object.keys(notes.body.data.fields)).toEqual(['notes'])
    expect(await count('customers')).toBe(before)
  })

  it('a call: NUL in the complaint is refused; line breaks in it are kept', async () => {
    const before = await count('calls')
    const call = {
      customerId: IDS.customer, unitId: IDS.unit, locationText: 'Route 8 eastbound, mile 44', complaint: `No crank${NUL}`,
    }
    const r = await dispatcher.post('/api/calls', call)
    expect(r.status).toBe(400)
    expect(r.body.data.fields.complaint).toBeTruthy()
    const tab = await dispatcher.post('/api/calls', { ...call, complaint: 'No crank', locationText: 'Route 8\tmile 44' })
    expect(tab.status).toBe(400)
    expect(tab.body.data.fields.locationText).toBeTruthy()
    expect(await count('calls')).toBe(before)
  })

  it('a unit edit', async () => {
    const unit = (await dispatcher.get(`/api/units/${IDS.unit}`)).body
    const r = await dispatcher.patch(`/api/units/${IDS.unit}`, { version: unit.version, notes: `ok\u001b[31m` })
    expect(r.status).toBe(400)
    expect(r.body.data.fields.notes).toBeTruthy()
    expect((await dispatcher.get(`/api/units/${IDS.unit}`)).body.version).toBe(unit.version)
  })

  it('a person (admin) and a sign-in', async () => {
    const before = await count('users')
    const person = { email: `n${Date.now()}@wayside.test`, name: `Name${NUL}`, role: 'office', password: 'copper lantern meadow' }
    const r = await admin.post('/api/users', person)
    expect(r.status).toBe(400)
    expect(r.body.data.fields.name).toBeTruthy()
    expect(await count('users')).toBe(before)
    const login = await new ApiClient().post('/api/auth/login', { email: `office${NUL}@wayside.test`, password: 'wayside-demo' })
    expect(login.status).toBe(400)
    expect(login.body.data.fields.email).toBeTruthy()
  })

  it('a test card (admin)', async () => {
    const before = await count('test_cards')
    const r = await admin.post('/api/test-cards', {
      slug: `nul-${Date.now().toString(36)}`,
      definition: {
        title: `Glow plug${NUL}`, componentType: 'Glow plug', codePatterns: ['P0671'], cautions: [], tools: [],
        steps: [{
          id: 'a', title: 'Plug', instruction: 'Measure.', measure: 'resistance',
          spec: { kind: 'range', min: 0.2, max: 2 }, next: { pass: 'ok', fail: 'bad' },
        }],
        conclusions: [{ id: 'ok', text: 'Good', kind: 'ok' }, { id: 'bad', text: 'Replace', kind: 'fault' }],
      },
    })
    expect(r.status).toBe(400)
    expect(r.body.data.fields['definition.title']).toBeTruthy()
    expect(await count('test_cards')).toBe(before)
  })

  it.each(['/api/calls', '/api/customers', '/api/units'])('a search on %s', async (path) => {
    for (const q of ['%00', 'brake%00pads', '%1B', '%C2%85']) {
      const r = await office.get(`${path}?q=${q}`)
      expect(r.status, `${path}?q=${q}`).toBe(400)
      expect(r.body.data.fields.q).toMatch(/control character|Search/)
    }
    expect((await office.get(`${path}?q=brake%20pads`)).status).toBe(200)
  })
})

describe('dates outside a sane range answer 400 naming the field', () => {
  it.each([
    ['from=1999-12-31&to=2000-01-20', 'from', /before 2000/],
    ['from=2026-01-01&to=2099-01-01', 'to', /years ahead/],
    ['from=2026-02-30&to=2026-03-10', 'from', /not a real date/],
    ['from=0001-01-01&to=2026-01-01', 'from', /before 2000/],
    ['from=%00&to=2026-01-01', 'from', /date/],
  ])('reports ?%s', async (query, field, reason) => {
    const r = await office.get(`/api/reports/calls-per-day?${query}`)
    expect(r.status).toBe(400)
    expect(r.body.data.fields[field]).toMatch(reason)
  })

  it('takes an ordinary range', async () => {
    expect((await office.get('/api/reports/calls-per-day?from=2026-01-01&to=2026-01-31')).status).toBe(200)
  })
})

describe('canonical ids', () => {
  it('takes a photo\'s bytes under an upper-case id and keeps them under the one lower-case id', async () => {
    const callId = await makeCall()
    const d = new Device(mech1)
    const bytes = jpegBytes(300)
    const op = d.op('photo', { callId, sha256: sha256(bytes), contentType: 'image/jpeg', sizeBytes: bytes.length })
    expect((await d.push([op])).body.results[0].status).toBe('applied')
    const upper = op.entityId.toUpperCase()
    const headers = { 'content-type': 'image/jpeg', 'x-content-sha256': sha256(bytes) }
    const put = await mech1.request('PUT', `/api/photos/${upper}`, { body: bytes, headers })
    expect(put.status).toBe(200)
    expect(put.body.id).toBe(op.entityId)
    const got = await fetch(`${BASE_URL}/api/photos/${op.entityId}`, { headers: { cookie: mech1.cookie } })
    expect(got.status).toBe(200)
    expect(Buffer.from(await got.arrayBuffer()).equals(bytes)).toBe(true)
    const again = await mech1.request('PUT', `/api/photos/${op.entityId}`, { body: bytes, headers })
    expect(again.body.stored).toBe('already')
  })
})

describe('a mechanic\'s view of a call', () => {
  it('carries no billing terms, billing e-mail or customer notes; the office\'s does', async () => {
    const callId = await makeCall()
    const mine = await mech1.get(`/api/calls/${callId}`)
    expect(mine.status).toBe(200)
    expect(mine.body.customer.name).toBeTruthy()
    for (const k of ['billingTerms', 'billingEmail', 'notes', 'netDays', 'taxExempt']) expect(mine.body.customer, k).not.toHaveProperty(k)
    const theirs = await office.get(`/api/calls/${callId}`)
    expect(theirs.body.customer).toHaveProperty('billingTerms')
  })

  it('nor does a unit\'s history read through a call of theirs', async () => {
    await makeCall()
    const r = await mech1.get(`/api/units/${IDS.unit}`)
    expect(r.status).toBe(200)
    for (const k of ['billingTerms', 'billingEmail', 'notes', 'netDays']) expect(r.body.customer, k).not.toHaveProperty(k)
  })

  it('and neither do the pull\'s customer rows', async () => {
    await makeCall()
    const d = new Device(mech1)
    const r = await d.pull()
    expect(r.status).toBe(200)
    const customers = r.body.changes.customers as Record<string, unknown>[]
    expect(customers.length).toBeGreaterThan(0)
    for (const c of customers) {
      for (const k of ['billingTerms', 'billingEmail', 'notes', 'netDays']) expect(c, k).not.toHaveProperty(k)
    }
  })
})

describe('a NUL in a path', () => {
  it('answers 400, never 500', async () => {
    const r = await office.get(`/api/calls/${randomUUID().slice(0, 35)}%00`)
    expect(r.status).toBe(400)
  })
})
