import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import type { ApiClient } from '../support/api'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'

const day = (d: Date) => d.toISOString().slice(0, 10)
const to = day(new Date())
const from = day(new Date(Date.now() - 60 * 86_400_000))
let office: ApiClient
beforeAll(async () => { office = await signedIn(DEMO.office) })
afterAll(closeTestPool)

// Each report is checked against the raw rows, counted here in plain JavaScript.
describe('reports', () => {
  it('counts calls per day, one row per day of the range', async () => {
    const r = await office.get(`/api/reports/calls-per-day?from=${from}&to=${to}`)
    expect(r.status).toBe(200)
    expect(r.body.rows).toHaveLength(61)
    const { rows } = await testPool().query(`SELECT received_at FROM calls WHERE received_at >= $1::date AND received_at < $2::date + 1`, [from, to])
    expect(r.body.rows.reduce((s: number, x: any) => s + x.received, 0)).toBe(rows.length)
  })

  it('gives the outcome shares of finished calls', async () => {
    const r = await office.get(`/api/reports/fix-rate?from=${from}&to=${to}`)
    const { rows } = await testPool().query(`SELECT outcome FROM calls WHERE outcome IS NOT NULL AND completed_at >= $1::date AND completed_at < $2::date + 1`, [from, to])
    const byOutcome = new Map<string, number>()
    for (const x of rows) byOutcome.set(x.outcome, (byOutcome.get(x.outcome) ?? 0) + 1)
    for (const row of r.body.rows) {
      expect(row.calls).toBe(byOutcome.get(row.outcome))
      expect(row.pct).toBeCloseTo(100 * row.calls / rows.length, 1)
    }
    expect(r.body.rows.reduce((s: number, x: any) => s + x.calls, 0)).toBe(rows.length)
  })

  it('finds the seeded comeback: the same SPN/FMI on the same unit within 30 days', async () => {
    const r = await office.get(`/api/reports/comebacks?from=${from}&to=${to}`)
    expect(r.body.rows).toEqual(expect.arrayContaining([expect.objectContaining({ code: 'SPN 3516 FMI 18', firstCall: 10, repeatCall: 11 })]))
    for (const row of r.body.rows) expect(row.days).toBeLessThanOrEqual(30)
  })

  it('sums parts and revenue', async () => {
    const parts = await office.get(`/api/reports/parts?from=${from}&to=${to}`)
    const def = parts.body.rows.find((p: any) => p.partNumber === 'TR-DEF-10')
    expect(def).toMatchObject({ quantity: 3, calls: 1 })
    const rev = await office.get(`/api/reports/revenue?from=${from}&to=${to}`)
    const { rows } = await testPool().query(`SELECT total_cents FROM invoices WHERE status <> 'void' AND created_at >= $1::date AND created_at < $2::date + 1`, [from, to])
    expect(rev.body.rows.reduce((s: number, x: any) => s + x.totalCents, 0)).toBe(rows.reduce((s, x) => s + x.total_cents, 0))
  })

  it('refuses a bad range naming the field, and mechanics', async () => {
    const bad = await office.get('/api/reports/revenue?from=2026-13-45')
    expect(bad.status).toBe(400)
    expect(bad.body.data.fields.from).toBeTruthy()
    const backwards = await office.get('/api/reports/revenue?from=2026-05-02&to=2026-05-01')
    expect(backwards.status).toBe(400)
    expect(backwards.body.data.fields.from).toMatch(/before/)
    expect((await (await signedIn(DEMO.mech1)).get('/api/reports/revenue')).status).toBe(403)
  })
})
