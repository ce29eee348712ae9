// One active call per mechanic, on the phone at 360 px with no signal: driving to a second call
// pauses the first (its travel clock stops), the odometer and engine hours are typed on arrival,
// and back in signal the dispatch board shows the first call paused for another.
import { randomUUID } from 'node:crypto'
import { expect, test, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'
import { signIn, signInSynced, PHONE } from './helpers'

/** What the phone's screen shows, bottom bar included. */
const view = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png` })
const MECH = seedId('user:mech3')
const unitId = randomUUID()
const calls: { id: string, number: number, where: string }[] = []

test.beforeAll(async () => {
  const db = testPool()
  await db.query(`INSERT INTO units (id, customer_id, unit_number, odometer, odometer_unit, engine_hours)
    VALUES ($1, $2, $3, 400000, 'mi', 12000)`, [unitId, seedId('customer:prairie'), `PAUSE-${unitId.slice(0, 6)}`])
  for (const where of ['I-94 eastbound at mile 201, pause test', 'County Road 9 truck stop, pause test']) {
    const id = randomUUID()
    const { rows: [c] } = await db.query(`INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id,
      received_at, assigned_at, status_changed_at)
      VALUES ($1, 'assigned', $2, $3, $4, 'Air leak at the trailer glad hands', $5,
        now() - interval '1 hour', now() - interval '1 hour', now() - interval '1 hour') RETURNING number`,
    [id, seedId('customer:prairie'), unitId, where, MECH])
    await db.query(`INSERT INTO call_events (call_id, kind, to_status, mechanic_id) VALUES ($1, 'assigned', 'assigned', $2)`, [id, MECH])
    calls.push({ id, number: c.number, where })
  }
})

test.afterAll(async () => {
  const db = testPool()
  const ids = calls.map(c => c.id)
  for (const t of ['clock_events', 'call_events', 'conflicts']) await db.query(`DELETE FROM ${t} WHERE call_id = ANY($1)`, [ids])
  await db.query('DELETE FROM calls WHERE id = ANY($1)', [ids])
  await db.query('DELETE FROM units WHERE id = $1', [unitId])
})

test('starting a second call pauses the first; readings on arrival; the board shows the pause', async ({ browser }) => {
  test.slow()
  const [a, b] = calls as [typeof calls[number], typeof calls[number]]
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signInSynced(page, 'mech3@wayside.test')
  await page.goto(`/m/calls/${a.id}`)
  await expect(page.getByRole('heading', { level: 1, name: `Call #${a.number}` })).toBeVisible()
  await ctx.setOffline(true)

  // Driving to the first call.
  await page.getByRole('button', { name: 'Start driving', exact: true }).click()
  await expect(page.getByText('Travel · running')).toBeVisible()

  // Sent to the second call before reaching the first: the button names the call it pauses.
  await page.goto(`/m/calls/${b.id}`)
  await expect(page.getByRole('heading', { level: 1, name: `Call #${b.number}` })).toBeVisible()
  const go = page.getByRole('button', { name: `Pause #${a.number} and start driving` })
  await expect(go).toBeVisible()
  await page.locator('#steps-title').evaluate(el => el.scrollIntoView({ block: 'start' }))
  await view(page, 'field-pause-button-360')
  await go.click()
  await expect(page.getByRole('listitem').filter({ hasText: 'Driving out' }).first()).toHaveAttribute('aria-current', 'step')
  await expect(page.getByText('Travel · running')).toBeVisible()

  // Arrived: the truck's readings, a bad one named first.
  await page.getByRole('button', { name: 'Arrived at the truck' }).click()
  const readings = page.locator('section[aria-labelledby="truck-readings-title"]')
  await expect(readings).toContainText('Last known: 400,000 mi')
  await readings.getByLabel('Odometer (mi)').fill('412 300 miles')
  await readings.getByLabel('Engine hours').fill('12480,5')
  await readings.getByRole('button', { name: 'Save readings' }).click()
  await expect(readings.getByText('Odometer must be a number')).toBeVisible()
  await expect(readings.getByLabel('Odometer (mi)')).toHaveAttribute('aria-invalid', 'true')
  await readings.screenshot({ path: 'tests/e2e/screenshots/field-truck-readings-error-360.png' })
  await readings.getByLabel('Odometer (mi)').fill('412300')
  await readings.getByRole('button', { name: 'Save readings' }).click()
  await expect(readings.getByText('Readings saved on the phone.')).toBeVisible()
  await readings.screenshot({ path: 'tests/e2e/screenshots/field-truck-readings-360.png' })

  // The first call shows paused, its travel stopped; going back there is a plain start.
  await page.goto(`/m/calls/${a.id}`)
  await expect(page.getByTestId('call-paused')).toBeVisible()
  await expect(page.getByText('Travel · running')).toHaveCount(0)
  await expect(page.getByRole('button', { name: 'Start driving', exact: true })).toBeVisible()
  await page.locator('#steps-title').evaluate(el => el.scrollIntoView({ block: 'start' }))
  await view(page, 'field-pause-paused-360')

  // Back in signal: everything goes up.
  await ctx.setOffline(false)
  const chip = page.getByTestId('sync-chip')
  await expect(chip).toHaveAttribute('data-waiting', '0', { timeout: 30_000 })
  await expect(chip).not.toHaveAttribute('data-state', /syncing|paused|rejected/, { timeout: 30_000 })

  const db = testPool()
  const row = async (id: string) => (await db.query('SELECT * FROM calls WHERE id = $1', [id])).rows[0]
  expect(await row(a.id)).toMatchObject({ status: 'assigned', en_route_at: expect.any(Date) })
  expect(await row(b.id)).toMatchObject({ status: 'on_site', odometer_reading: 412300, engine_hours_reading: 12480.5 })
  const kinds = await db.query(`SELECT kind FROM clock_events WHERE call_id = $1 ORDER BY device_at`, [a.id])
  expect(kinds.rows.map(r => r.kind)).toEqual(['travel_start', 'pause'])
  expect((await db.query('SELECT odometer, engine_hours FROM units WHERE id = $1', [unitId])).rows[0])
    .toEqual({ odometer: 412300, engine_hours: 12480.5 })

  // The dispatch board says the first call is paused for another.
  const desk = await browser.newContext({ viewport: { width: 1280, height: 800 } })
  const board = await desk.newPage()
  await signIn(board, 'dispatch@wayside.test')
  await board.goto('/dispatch')
  const line = board.getByRole('row').filter({ hasText: a.where })
  await expect(line).toContainText('Paused for another call')
  await expect(board.getByRole('row').filter({ hasText: b.where })).not.toContainText('Paused for another call')
  await line.scrollIntoViewIfNeeded()
  await board.screenshot({ path: 'tests/e2e/screenshots/field-pause-board.png' })
  await desk.close()
  await ctx.close()
})
