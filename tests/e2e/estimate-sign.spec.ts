// A card customer's call at 360 px with no signal: the phone asks the driver to sign the estimate
// before the repair, the driver reads it, types a name and signs; a part beyond it asks again; back
// in signal the signed estimate reaches the office's call page.
import { randomUUID } from 'node:crypto'
import { expect, test, type Locator, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { count, testPool } from '../support/db'
import { signIn, drawSignature, signInSynced, PHONE } from './helpers'

const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })
/** One section alone, to read at the phone's width. */
const shotOf = (where: Locator, name: string) => where.screenshot({ path: `tests/e2e/screenshots/${name}.png` })
const cents = (text: string | null) => Math.round(Number(String(text).replace(/[^0-9.]/g, '')) * 100)

let callId: string
test.beforeAll(async () => {
  const db = testPool()
  callId = randomUUID()
  await db.query(`INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id, assigned_at, on_site_at)
    VALUES ($1, 'on_site', $2, $3, 'County Road 12 at the grain elevator', 'Coolant temperature warning', $4, now() - interval '2 hours',
      now() - interval '1 hour')`,
  [callId, seedId('customer:vossberg'), seedId('unit:7'), seedId('user:mech1')])
  await db.query(`INSERT INTO call_events (call_id, kind, to_status, mechanic_id) VALUES ($1, 'assigned', 'assigned', $2)`,
    [callId, seedId('user:mech1')])
  await db.query(`INSERT INTO clock_events (call_id, kind, device_at) VALUES ($1, 'work_start', now() - interval '30 minutes')`, [callId])
})

test('offline at 360 px the driver signs the estimate before the repair; the office sees it', async ({ browser }) => {
  test.slow()
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signInSynced(page, 'mech1@wayside.test')
  await page.goto(`/m/calls/${callId}`)
  await ctx.setOffline(true)

  // Not signed yet: the section says so, and the repair steps ask for it first.
  const section = page.getByTestId('presign')
  await expect(section).toHaveAttribute('data-need', 'unsigned')
  await expect(page.getByTestId('presign-state')).toContainText('Not signed yet')
  await expect(page.getByTestId('presign-ask')).toContainText('has not signed the estimate')
  await section.scrollIntoViewIfNeeded()
  await shot(page, 'presign-unsigned-offline-360')
  await shotOf(page.getByTestId('presign-ask'), 'presign-ask-offline-360')

  const form = page.getByRole('form', { name: 'The estimate to sign' })
  await form.getByLabel('What will be done, in a line').fill('Replace the coolant temperature sensor')
  await form.getByLabel('Labor expected, hours').fill('1.5')
  await form.getByLabel('Part no.').fill('TR-ECT-10K')
  await form.getByLabel('What the part is').fill('Coolant temperature sensor')
  await form.getByLabel('Price each, before markup').fill('120.00')
  await form.getByRole('button', { name: 'Add this part to the estimate' }).click()
  await expect(form.getByText('TR-ECT-10K', { exact: true })).toBeVisible()
  const estimate = page.getByTestId('presign-estimate')
  await expect(estimate).toContainText('Coolant temperature sensor (expected)')
  await expect(estimate).toContainText('Tax')
  const total = cents(await page.getByTestId('presign-total').textContent())
  expect(total).toBeGreaterThan(12_000)

  // Signing with no signature drawn is refused in words; then the driver signs.
  await form.getByLabel('Name of the driver signing').fill('Rolf Vossberg')
  await form.getByRole('button', { name: 'Sign the estimate' }).click()
  await expect(form.getByText('The driver signs in the box first')).toBeVisible()
  // A screenshot taller than the screen resizes the page, and a resized pad starts blank: take it before the strokes.
  await shotOf(section, 'presign-form-offline-360')
  await drawSignature(page, 'estimate-signature-pad')
  await form.getByRole('button', { name: 'Sign the estimate' }).click()
  await expect(section).toHaveAttribute('data-need', 'signed')
  await expect(page.getByTestId('presign-signed')).toContainText('Rolf Vossberg signed the estimate of')
  // The amount signed is the estimate's total at the moment of signing (the clock runs on, by tenths of an hour).
  const signedText = await page.getByTestId('presign-signed').textContent()
  const signedCents = cents(/of \$([\d,]+\.\d\d)/.exec(signedText ?? '')?.[1] ?? '')
  expect(Math.abs(signedCents - total)).toBeLessThan(5_000)
  await expect(page.getByTestId('presign-ask')).toHaveCount(0)
  await shotOf(section, 'presign-signed-offline-360')
  expect(await count('estimate_signatures', 'call_id = $1', [callId])).toBe(0)

  // A part the estimate did not have takes it above what was signed: a new signature is asked.
  const parts = page.locator('section[aria-labelledby="parts-title"]')
  const fold = parts.getByRole('button', { name: 'Add a part' })
  if (await fold.isVisible()) await fold.click()
  await parts.getByLabel('Part number').fill('TR-PT-3')
  await parts.getByLabel('Description').fill('Sensor pigtail')
  await parts.getByLabel('Quantity').fill('1')
  await parts.getByLabel('Unit price').fill('180.00')
  await parts.getByRole('button', { name: 'Add part' }).click()
  await expect(section).toHaveAttribute('data-need', 'above')
  await expect(page.getByTestId('presign-state')).toContainText('above the')
  await shotOf(section, 'presign-above-offline-360')

  // Back in signal: the signature travels with the outbox, for the amount the driver saw.
  await ctx.setOffline(false)
  await expect.poll(() => count('estimate_signatures', 'call_id = $1', [callId]), { timeout: 30_000 }).toBe(1)
  const { rows: [row] } = await testPool().query('SELECT amount_cents, driver_name FROM estimate_signatures WHERE call_id = $1', [callId])
  expect(row).toMatchObject({ amount_cents: signedCents, driver_name: 'Rolf Vossberg' })

  const office = await browser.newContext({ viewport: { width: 1280, height: 900 } })
  const desk = await office.newPage()
  await signIn(desk, 'dispatch@wayside.test')
  await desk.goto(`/calls/${callId}`)
  const panel = desk.getByTestId('call-signed-estimates')
  const dollars = (signedCents / 100).toLocaleString('en-US', { minimumFractionDigits: 2 })
  await expect(panel).toContainText(`Driver signed the estimate of $${dollars}`)
  await expect(panel).toContainText('Rolf Vossberg: Replace the coolant temperature sensor')
  await expect(panel.getByRole('img', { name: 'Signature of Rolf Vossberg on the estimate' })).toBeVisible()
  await panel.scrollIntoViewIfNeeded()
  await shot(desk, 'presign-office-call')
  await shotOf(panel, 'presign-office-panel')
  await Promise.all([ctx.close(), office.close()])
})
