// A mechanic with a long history: the first pull is their working set in pages, not their career.
import { randomUUID } from 'node:crypto'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { signedIn } from '../support/api'
import { closeTestPool, testPool } from '../support/db'
import { DEMO } from '../support/env'
import { Device, IDS, idsOf } from '../support/sync'

const made = { calls: [] as string[], units: [] as string[], cards: [] as string[] }
afterAll(async () => {
  const db = testPool()
  await db.query('DELETE FROM notes WHERE call_id = ANY($1)', [made.calls])
  await db.query('DELETE FROM call_events WHERE call_id = ANY($1)', [made.calls])
  await db.query('DELETE FROM calls WHERE id = ANY($1)', [made.calls])
  await db.query('DELETE FROM units WHERE id = ANY($1)', [made.units])
  await db.query('DELETE FROM test_card_versions WHERE card_id = ANY($1)', [made.cards])
  await db.query('DELETE FROM test_cards WHERE id = ANY($1)', [made.cards])
  await closeTestPool()
})

let mech2: Awaited<ReturnType<typeof signedIn>>
beforeAll(async () => {
  mech2 = await signedIn(DEMO.mech2)
})

async function unit(label: string) {
  const id = randomUUID()
  made.units.push(id)
  await testPool().query('INSERT INTO units (id, customer_id, unit_number) VALUES ($1, $2, $3)',
    [id, IDS.customer, `${label}-${id.slice(0, 6)}`])
  return id
}

/** Calls of mech2 on a unit, received `daysAgo` days ago (one minute apart), each with two notes. */
async function history(unitId: string, n: number, daysAgo: number, status = 'paid') {
  const ids = Array.from({ length: n }, () => randomUUID())
  made.calls.push(...ids)
  await testPool().query(`
    INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, complaint, mechanic_id, received_at, assigned_at)
    SELECT id, $2::call_status, CASE WHEN $2::text = 'assigned' THEN NULL ELSE 'repaired'::call_outcome END, $3, $4, 'Yard, test',
      'History test', $5, now() - make_interval(days => $6::int, mins => i::int), now() - make_interval(days => $6::int, mins => i::int)
    FROM unnest($1::uuid[]) WITH ORDINALITY AS t(id, i)`, [ids, status, IDS.customer, unitId, IDS.mech2, daysAgo])
  await testPool().query(`INSERT INTO notes (call_id, text)
    SELECT id, 'Old note ' || n FROM unnest($1::uuid[]) AS id, generate_series(1, 2) AS n`, [ids])
  return ids
}

type Page = { status: number, body: any }
async function pullAll(d: Device, limit: number, cursor?: string) {
  const pages: Page[] = []
  let next = cursor
  do {
    const r = await d.api.get(`/api/sync/pull?clientId=${d.clientId}&limit=${limit}${next ? `&cursor=${next}` : ''}`)
    expect(r.status).toBe(200)
    pages.push(r)
    next = r.body.cursor
  } while (pages.at(-1)!.body.more && pages.length < 200)
  const all = (key: string) => pages.flatMap(p => p.body.changes[key] as { id: string }[])
  return { pages, all, cursor: next! }
}

const rowsOf = (p: Page) => Object.entries(p.body.changes).filter(([k]) => k !== 'testCards' && k !== 'rates')
  .reduce((n, [, rows]) => n + (rows as unknown[]).length, 0)

/** `n` calls of mech2, each on a unit of its own among `units` new ones, received over the last years (bulk). */
async function career(units: number, n: number) {
  const unitIds = await Promise.all(Array.from({ length: units }, () => unit('CAREER')))
  const ids = Array.from({ length: n }, () => randomUUID())
  made.calls.push(...ids)
  await testPool().query(`
    INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, complaint, mechanic_id, received_at, assigned_at)
    SELECT id, 'paid', 'repaired', $2, ($3::uuid[])[1 + (i % array_length($3::uuid[], 1))], 'Yard, test', 'Career test', $4,
      now() - make_interval(days => 60 + (i % 2000)::int), now() - make_interval(days => 60 + (i % 2000)::int)
    FROM unnest($1::uuid[]) WITH ORDINALITY AS t(id, i)`, [ids, IDS.customer, unitIds, IDS.mech2])
  await testPool().query(`INSERT INTO notes (call_id, text)
    SELECT id, 'Career note ' || n FROM unnest($1::uuid[]) AS id, generate_series(1, 2) AS n`, [ids])
  return { ids, unitIds }
}

describe('pull: a long history, paged', () => {
  it('gives the working set in pages with `more`, each row once, and the unit\'s last few earlier calls, not every one', async () => {
    const worked = await unit('HIST')
    const other = await unit('OLD')
    const old = await history(worked, 40, 400)
    const [open] = await history(worked, 1, 2, 'assigned')
    const recent = await history(worked, 3, 10)
    const elsewhere = await history(other, 12, 300)
    // A career: three thousand earlier calls on units the mechanic no longer works on.
    const past = await career(40, 3000)
    const d = new Device(mech2)
    await d.push([])
    const { pages, all } = await pullAll(d, 25)

    expect(pages.length).toBeGreaterThan(1)
    for (const p of pages.slice(0, -1)) expect(p.body.more).toBe(true)
    expect(pages.at(-1)!.body.more).toBe(false)
    for (const p of pages) expect(rowsOf(p)).toBeLessThanOrEqual(25)
    // The card library comes whole on the first page only.
    expect(pages[0]!.body.changes.testCards.length).toBeGreaterThan(0)
    for (const p of pages.slice(1)) expect(p.body.changes.testCards).toEqual([])

    const calls = idsOf(all('calls'))
    expect(all('calls')).toHaveLength(calls.size)
    expect(calls.has(open!)).toBe(true)
    for (const id of recent) expect(calls.has(id)).toBe(true)
    // Of the 40 earlier calls on the unit, the last five (the newest received first).
    expect(old.filter(id => calls.has(id))).toEqual(old.slice(0, 5))
    for (const id of [...elsewhere, ...past.ids]) expect(calls.has(id)).toBe(false)
    expect(idsOf(all('units')).has(other)).toBe(false)
    for (const id of past.unitIds) expect(idsOf(all('units')).has(id)).toBe(false)
    // Only the working set: the mechanic's open calls and those of the last 30 days, with each unit's last five.
    const { rows: [mine] } = await testPool().query(`SELECT count(*)::int AS n FROM calls WHERE mechanic_id = $1`, [IDS.mech2])
    expect(mine.n).toBeGreaterThan(3050)
    expect(calls.size).toBeLessThan(mine.n / 10)

    // Every record once, and never before its call: a page's records belong to calls given on it or earlier.
    const given = new Set<string>()
    for (const p of pages) {
      for (const c of p.body.changes.calls as { id: string }[]) given.add(c.id)
      for (const [key, rows] of Object.entries(p.body.changes as Record<string, { callId?: string }[]>)) {
        if (['calls', 'units', 'customers', 'testCards', 'rates'].includes(key)) continue
        for (const r of rows) expect(given.has(r.callId!), `${key} before its call`).toBe(true)
      }
    }
    for (const key of Object.keys(pages[0]!.body.changes)) {
      const rows = all(key)
      expect(idsOf(rows).size, key).toBe(rows.length)
    }
    const notes = all('notes') as unknown as { id: string, callId: string }[]
    const { rows: [stored] } = await testPool().query('SELECT count(*)::int AS n FROM notes WHERE call_id = ANY($1)', [[...calls]])
    expect(notes).toHaveLength(stored.n)
    expect(notes.filter(n => n.callId === open)).toHaveLength(2)
  }, 120_000)

  it('afterwards brings what changed on any of the mechanic\'s calls, however old', async () => {
    const u = await unit('LATE')
    const [ancient] = await history(u, 1, 900)
    const d = new Device(mech2)
    const first = await pullAll(d, 500)
    expect(idsOf(first.all('calls')).has(ancient!)).toBe(false)
    await testPool().query(`UPDATE calls SET story_cause = 'Rewritten by the office' WHERE id = $1`, [ancient])
    let seen = false
    for (let i = 0; i < 50 && !seen; i++) {
      const next = await pullAll(d, 500, first.cursor)
      seen = idsOf(next.all('calls')).has(ancient!)
      if (!seen) await new Promise(res => setTimeout(res, 200))
    }
    expect(seen).toBe(true)
  })

  it('refuses a cursor it did not give and a limit out of range, naming the field', async () => {
    const d = new Device(mech2)
    for (const bad of ['1.2.99.', 'abc', '1.2.3.not-a-uuid']) {
      const r = await d.api.get(`/api/sync/pull?cursor=${bad}`)
      expect(r.status, bad).toBe(400)
      expect(r.body.data.fields).toHaveProperty('cursor')
    }
    for (const bad of ['0', '100001', 'many']) {
      const r = await d.api.get(`/api/sync/pull?limit=${bad}`)
      expect(r.status, bad).toBe(400)
      expect(r.body.data.fields).toHaveProperty('limit')
    }
  })
})

describe('pull: the card library', () => {
  it('first: every card in use, none turned off or unreadable; later: a turned-off card with active false', async () => {
    const db = testPool()
    const card = async (active: boolean, definition: unknown) => {
      const id = randomUUID()
      made.cards.push(id)
      await db.query(`INSERT INTO test_cards (id, slug, title, component_type, active) VALUES ($1, $2, 'Pull test card', 'sensor', $3)`,
        [id, `pull-${id}`, active])
      await db.query(`INSERT INTO test_card_versions (card_id, card_version, definition) VALUES ($1, 1, $2)`,
        [id, JSON.stringify(definition)])
      return id
    }
    const { rows: [good] } = await db.query(`SELECT v.definition FROM test_cards c JOIN test_card_versions v ON v.card_id = c.id
      AND v.card_version = c.current_version WHERE c.active ORDER BY c.slug LIMIT 1`)
    const on = await card(true, good.definition)
    const off = await card(false, good.definition)
    const broken = await card(true, { steps: 'not a list' })
    const d = new Device(mech2)
    const first = await pullAll(d, 2000)
    const cards = first.pages[0]!.body.changes.testCards as any[]
    expect(cards.find(c => c.id === on)).toMatchObject({ active: true, currentVersion: 1, version: 1, title: expect.any(String) })
    expect(cards.find(c => c.id === off)).toBeUndefined()
    expect(cards.find(c => c.id === broken)).toBeUndefined()
    const shape = ['active', 'componentType', 'currentVersion', 'definition', 'id', 'slug', 'title', 'updatedAt', 'version']
    expect(Object.keys(cards[0]).sort()).toEqual(shape)

    await db.query('UPDATE test_cards SET active = false WHERE id = $1', [on])
    let dropped: any
    for (let i = 0; i < 50 && !dropped; i++) {
      dropped = (await pullAll(d, 2000, first.cursor)).pages[0]!.body.changes.testCards.find((c: any) => c.id === on)
      if (!dropped) await new Promise(res => setTimeout(res, 200))
    }
    expect(dropped).toMatchObject({ id: on, active: false })
  })
})
