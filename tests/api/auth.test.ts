import { afterAll, describe, expect, it } from 'vitest'
import { ApiClient, signedIn } from '../support/api'
import { DEMO } from '../support/env'
import { closeTestPool, testPool } from '../support/db'

afterAll(closeTestPool)

describe('sign-in', () => {
  it.each([
    ['admin', DEMO.admin], ['dispatcher', DEMO.dispatcher], ['office', DEMO.office], ['mechanic', DEMO.mech1], ['mechanic', DEMO.mech2],
  ])('signs in as %s (%s) and the session says who', async (role, email) => {
    const c = new ApiClient()
    const user = await c.login(email)
    expect(user.role).toBe(role)
    const s = await c.get('/api/_auth/session')
    expect(s.body.user).toMatchObject({ email, role })
  })

  it('answers a wrong password and an unknown e-mail with the same 401 message', async () => {
    const a = await new ApiClient().post('/api/auth/login', { email: DEMO.office, password: 'not-the-password' })
    const b = await new ApiClient().post('/api/auth/login', { email: 'nobody@wayside.test', password: 'not-the-password' })
    expect(a.status).toBe(401)
    expect(b.status).toBe(401)
    expect(a.body.message).toBe(b.body.message)
    expect(a.body.message).toMatch(/e-mail or password/i)
  })

  it('names the bad field when the body is malformed', async () => {
    const r = await new ApiClient().post('/api/auth/login', { email: 'not-an-email' })
    expect(r.status).toBe(400)
    expect(Object.keys(r.body.data.fields)).toEqual(expect.arrayContaining(['email', 'password']))
  })

  it('signs out', async () => {
    const c = await signedIn(DEMO.office)
    expect((await c.post('/api/auth/logout')).status).toBe(200)
    expect((await c.get('/api/calls')).status).toBe(401)
  })
})

describe('roles', () => {
  it('refuses the admin-only people list: 401 signed out, 403 to the other roles, 200 to admin', async () => {
    expect((await new ApiClient().get('/api/users')).status).toBe(401)
    for (const email of [DEMO.dispatcher, DEMO.office, DEMO.mech1]) {
      const c = await signedIn(email)
      expect((await c.get('/api/users')).status, email).toBe(403)
    }
    expect((await (await signedIn(DEMO.admin)).get('/api/users')).status).toBe(200)
  })

  it('shows a mechanic only the calls assigned to them', async () => {
    const m = await signedIn(DEMO.mech1)
    const r = await m.get('/api/calls?pageSize=200')
    expect(r.status).toBe(200)
    expect(r.body.items.length).toBeGreaterThan(0)
    for (const call of r.body.items) expect(call.mechanicId).toBe(m.user.id)
  })

  it('refuses a state change without the X-Wayside header, and a form post', async () => {
    const c = await signedIn(DEMO.admin)
    const bare = await c.request('POST', '/api/users', { json: {}, noWaysideHeader: true })
    expect(bare.status).toBe(403)
    const form = await c.request('POST', '/api/users', {
      body: 'email=a%40b.c', headers: { 'content-type': 'application/x-www-form-urlencoded' },
    })
    expect(form.status).toBe(415)
  })
})

describe('people', () => {
  it('adds a person, who can sign in; once turned off, their live session stops working', async () => {
    const admin = await signedIn(DEMO.admin)
    const email = `temp-${Date.now()}@wayside.test`
    const created = await admin.post('/api/users', { email, name: 'Temp Mechanic', role: 'mechanic', password: 'a-long-password' })
    expect(created.status).toBe(201)
    expect(created.body.passwordHash).toBeUndefined()

    const person = new ApiClient()
    await person.login(email, 'a-long-password')
    expect((await person.get('/api/calls')).status).toBe(200)

    expect((await admin.patch(`/api/users/${created.body.id}`, { active: false })).status).toBe(200)
    expect((await person.get('/api/calls')).status).toBe(401)
    expect((await new ApiClient().post('/api/auth/login', { email, password: 'a-long-password' })).status).toBe(401)
  })

  it('resets a password', async () => {
    const admin = await signedIn(DEMO.admin)
    const email = `reset-${Date.now()}@wayside.test`
    const { body } = await admin.post('/api/users', { email, name: 'Reset Me', role: 'office', password: 'first-password' })
    await admin.patch(`/api/users/${body.id}`, { password: 'second-password' })
    expect((await new ApiClient().post('/api/auth/login', { email, password: 'first-password' })).status).toBe(401)
    await new ApiClient().login(email, 'second-password')
  })

  it('refuses a duplicate e-mail with 422 naming the field, and writes nothing', async () => {
    const admin = await signedIn(DEMO.admin)
    const before = (await testPool().query('SELECT count(*)::int n FROM users')).rows[0].n
    const r = await admin.post('/api/users', {
      email: DEMO.mech1.toUpperCase(), name: 'Copy', role: 'mechanic', password: 'a-long-password',
    })
    expect(r.status).toBe(422)
    expect(r.body.data.fields.email).toBeTruthy()
    expect((await testPool().query('SELECT count(*)::int n FROM users')).rows[0].n).toBe(before)
  })
})

describe('sign-in limiter', () => {
  it('slows and then refuses an account after repeated failures, even with the right password', async () => {
    const admin = await signedIn(DEMO.admin)
    const email = `limit-${Date.now()}@wayside.test`
    await admin.post('/api/users', { email, name: 'Limit Test', role: 'office', password: 'right-password' })
    const times: number[] = []
    for (let i = 0; i < 5; i++) {
      const t0 = Date.now()
      const r = await new ApiClient().post('/api/auth/login', { email, password: `wrong-${i}` })
      times.push(Date.now() - t0)
      expect(r.status).toBe(401)
    }
    // Each failure adds to the wait before the next answer.
    expect(times[4]!).toBeGreaterThan(times[0]! + 500)
    const locked = await new ApiClient().post('/api/auth/login', { email, password: 'right-password' })
    expect(locked.status).toBe(429)
    expect(Number(locked.headers.get('retry-after'))).toBeGreaterThan(0)
  })
})
