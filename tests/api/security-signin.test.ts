// Sign-in under attack and sessions that end when they should: the limiter reserves each try in
// PostgreSQL before the password is checked; signing out, a new password or turning an account
// off ends that person's sessions on every device.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { ownServerPort, startOwnServer, type OwnServer } from '../support/server'

afterAll(closeTestPool)

// Passwords the rule accepts: three or four unrelated words.
const GOOD = 'copper lantern meadow'
const GOOD_2 = 'violet anchor thunder'

let admin: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  admin = await signedIn(DEMO.admin)
})

async function newPerson(role = 'office', password = GOOD) {
  const email = `sec-${randomUUID().slice(0, 8)}@wayside.test`
  const r = await admin.post('/api/users', { email, name: 'Sec Test Person', role, password })
  expect(r.status, JSON.stringify(r.body)).toBe(201)
  return { id: r.body.id as string, email }
}

/** The same session cookie in a second client: a copy someone kept. */
function copyOf(c: ApiClient) {
  const kept = new ApiClient(c.base)
  kept.cookie = c.cookie
  return kept
}

describe('the sign-in limiter', () => {
  it('checks exactly five of forty simultaneous wrong passwords; the rest wait (429, Retry-After); others still sign in', async () => {
    const { email } = await newPerson()
    const tries = await Promise.all(Array.from({ length: 40 }, (_, i) =>
      new ApiClient().post('/api/auth/login', { email, password: `wrong guess number ${i}` })))
    const checked = tries.filter(r => r.status === 401)
    const refused = tries.filter(r => r.status === 429)
    expect(checked.length).toBe(5)
    expect(refused.length).toBe(35)
    for (const r of refused) expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0)

    // Paused: even the right password waits now.
    const right = await new ApiClient().post('/api/auth/login', { email, password: GOOD })
    expect(right.status).toBe(429)
    expect(Number(right.headers.get('retry-after'))).toBeGreaterThan(60)

    // One person's pause is theirs alone.
    await new ApiClient().login(DEMO.dispatcher)
  })

  it('gives a signed-in account its count back, so old typos do not add up', async () => {
    const { email } = await newPerson()
    for (let round = 0; round < 3; round++) {
      for (let i = 0; i < 3; i++) {
        expect((await new ApiClient().post('/api/auth/login', { email, password: `typo ${round} ${i} here` })).status).toBe(401)
      }
      await new ApiClient().login(email, GOOD)
    }
  })

  describe('per address, on a server of its own with a low bound and a load balancer in front', () => {
    let server: OwnServer
    beforeAll(async () => {
      server = await startOwnServer(ownServerPort(6), { NUXT_LOGIN_MAX_FAILURES_PER_ADDRESS: '12', NUXT_TRUST_PROXY: 'true' })
    })
    afterAll(async () => {
      await server?.kill('SIGTERM')
    })

    const from = (ip: string, email: string, password: string) => fetch(`${server.url}/api/auth/login`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'x-wayside': '1', 'x-forwarded-for': ip },
      body: JSON.stringify({ email, password }),
    })

    it('pauses an address that spreads its guesses over many accounts, and no other address', async () => {
      const ip = `203.0.113.${Math.floor(Math.random() * 200) + 1}`
      const people = await Promise.all([newPerson(), newPerson(), newPerson(), newPerson()])
      // Four failures on each of three accounts: under each account's bound, at the address's.
      for (const p of people.slice(0, 3)) {
        for (let i = 0; i < 4; i++) expect((await from(ip, p.email, `guess ${i} again`)).status).toBe(401)
      }
      const paused = await from(ip, people[3]!.email, GOOD)
      expect(paused.status).toBe(429)
      expect(Number(paused.headers.get('retry-after'))).toBeGreaterThan(0)
      // The same person from another address signs in.
      expect((await from('198.51.100.7', people[3]!.email, GOOD)).status).toBe(200)
    })
  })
})

describe('sessions', () => {
  it('signing out ends every session of that person: a kept cookie and another device', async () => {
    const { email } = await newPerson()
    const phone = new ApiClient()
    await phone.login(email, GOOD)
    const desk = new ApiClient()
    await desk.login(email, GOOD)
    const kept = copyOf(phone)
    expect((await kept.get('/api/calls')).status).toBe(200)

    expect((await phone.post('/api/auth/logout')).status).toBe(200)
    expect((await kept.get('/api/calls')).status).toBe(401)
    expect((await desk.get('/api/calls')).status).toBe(401)
    expect((await copyOf(kept).get('/api/_auth/session')).body.user).toBeUndefined()
    // Signing in again makes a session that works.
    const again = new ApiClient()
    await again.login(email, GOOD)
    expect((await again.get('/api/calls')).status).toBe(200)
  })

  it('a new password ends the person\'s sessions made before it', async () => {
    const { id, email } = await newPerson()
    const before = new ApiClient()
    await before.login(email, GOOD)
    const kept = copyOf(before)
    expect((await admin.patch(`/api/users/${id}`, { password: GOOD_2 })).status).toBe(200)
    expect((await kept.get('/api/calls')).status).toBe(401)
    expect((await before.get('/api/_auth/session')).body.user).toBeUndefined()
    expect((await new ApiClient().post('/api/auth/login', { email, password: GOOD })).status).toBe(401)
    await new ApiClient().login(email, GOOD_2)
  })

  it('an admin who sets their own password stays signed in on that device only', async () => {
    const me = await newPerson('admin')
    const here = new ApiClient()
    await here.login(me.email, GOOD)
    const elsewhere = new ApiClient()
    await elsewhere.login(me.email, GOOD)
    expect((await here.patch(`/api/users/${me.id}`, { password: GOOD_2 })).status).toBe(200)
    expect((await here.get('/api/users')).status).toBe(200)
    expect((await elsewhere.get('/api/users')).status).toBe(401)
  })

  it('a turned-off person\'s session endpoint reports nobody, and turning them on again does not revive it', async () => {
    const { id, email } = await newPerson('mechanic')
    const person = new ApiClient()
    await person.login(email, GOOD)
    expect((await person.get('/api/_auth/session')).body.user).toMatchObject({ email })
    const kept = copyOf(person)

    expect((await admin.patch(`/api/users/${id}`, { active: false })).status).toBe(200)
    const s = await person.get('/api/_auth/session')
    expect(s.status).toBe(200)
    expect(s.body.user).toBeUndefined()
    expect(s.body.secure).toBeUndefined()
    expect((await person.get('/api/calls')).status).toBe(401)

    expect((await admin.patch(`/api/users/${id}`, { active: true })).status).toBe(200)
    expect((await kept.get('/api/calls')).status).toBe(401)
  })

  it('seals the epoch in the cookie without showing it to the browser', async () => {
    const c = await signedIn(DEMO.office)
    const s = await c.get('/api/_auth/session')
    expect(s.body.user).toMatchObject({ email: DEMO.office })
    expect(JSON.stringify(s.body)).not.toMatch(/epoch/)
  })

  it('sets the cookie HttpOnly and SameSite=Lax (Secure comes with production: security-production.test.ts)', async () => {
    const res = await fetch(`${new ApiClient().base}/api/auth/login`, {
      method: 'POST', headers: { 'content-type': 'application/json', 'x-wayside': '1' },
      body: JSON.stringify({ email: DEMO.office, password: 'wayside-demo' }),
    })
    const cookie = res.headers.getSetCookie().find(c => c.startsWith('nuxt-session='))!
    expect(cookie).toMatch(/HttpOnly/i)
    expect(cookie).toMatch(/SameSite=Lax/i)
  })
})

describe('new passwords', () => {
  it.each([
    ['short1234', /at least 10 characters/],
    ['wayside-demo', /Too easy to guess: .*tied to Wayside/],
    ['password1234', /Too easy to guess: .*commonly used password/],
    ['qwertyuiop12', /Too easy to guess/],
    ['aaaaaaaaaaaaaa', /Too easy to guess: repeated characters/],
  ])('refuses %s with the reason beside the box, and adds nobody', async (password, reason) => {
    const before = (await testPool().query('SELECT count(*)::int n FROM users')).rows[0].n
    const email = `weak-${randomUUID().slice(0, 8)}@wayside.test`
    const r = await admin.post('/api/users', { email, name: 'Weak Password', role: 'office', password })
    expect(r.status).toBe(400)
    expect(r.body.data.fields.password).toMatch(reason)
    expect((await testPool().query('SELECT count(*)::int n FROM users')).rows[0].n).toBe(before)
  })

  it('refuses a password made of the person\'s own name, on a reset too, and keeps the old one', async () => {
    const { id, email } = await newPerson()
    const r = await admin.patch(`/api/users/${id}`, { password: 'sec test person' })
    expect([400, 422]).toContain(r.status)
    expect(r.body.data.fields.password).toMatch(/Too easy to guess/)
    await new ApiClient().login(email, GOOD)
  })

  it('keeps the seeded demo password working (it is seeded, not typed)', async () => {
    await new ApiClient().login(DEMO.mech1, 'wayside-demo')
  })
})
