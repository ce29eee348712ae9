// The roadside estimate end to end at 360 px: a mechanic with no signal passes 80 % and then 100 % of
// the limit, asks the fleet for more, comes back into signal; the dispatcher sees the call waiting for
// approval on the board and makes a link; the fleet approves on its own page; the phone shows the new
// limit; the driver's sign-off shows the amount.
import { randomUUID } from 'node:crypto'
import { expect, test, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { count, testPool } from '../support/db'
import { signIn, signInSynced, PHONE } from './helpers'

const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })
const cents = (text: string | null) => Math.round(Number(String(text).replace(/[^0-9.]/g, '')) * 100)
const LIMIT = 1_000_000

let callId: string
let callNumber: number
test.beforeAll(async () => {
  const db = testPool()
  callId = randomUUID()
  const { rows: [c] } = await db.query(`INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id,
      assigned_at, on_site_at, po_number, auth_limit_cents)
    VALUES ($1, 'on_site', $2, $3, 'Route 8 eastbound, mile 31', 'Coolant temperature warning, derated', $4, now() - interval '2 hours',
      now() - interval '1 hour', 'PF-1001', $5) RETURNING number`,
  [callId, seedId('customer:prairie'), seedId('unit:7'), seedId('user:mech1'), LIMIT])
  callNumber = c.number
  await db.query(`INSERT INTO call_events (call_id, kind, to_status, mechanic_id) VALUES ($1, 'assigned', 'assigned', $2)`,
    [callId, seedId('user:mech1')])
  await db.query(`INSERT INTO clock_events (call_id, kind, device_at) VALUES ($1, 'work_start', now() - interval '40 minutes')`, [callId])
})

/** What one dollar of parts adds to the total: the markup, and the tax when parts are taxed. */
async function partFactor() {
  const { rows: [r] } = await testPool().query(`SELECT parts_markup_pct, tax_rate_basis_points, parts_taxable FROM rates
    ORDER BY effective_from DESC LIMIT 1`)
  return (1 + r.parts_markup_pct / 100) * (r.parts_taxable ? 1 + r.tax_rate_basis_points / 10_000 : 1)
}

async function addPart(page: Page, number: string, dollars: string, description: string) {
  const parts = page.locator('section[aria-labelledby="parts-title"]')
  const fold = parts.getByRole('button', { name: 'Add a part' })
  if (await fold.isVisible()) await fold.click()
  await parts.getByLabel('Part number').fill(number)
  await parts.getByLabel('Description').fill(description)
  await parts.getByLabel('Quantity').fill('1')
  await parts.getByLabel('Unit price').fill(dollars)
  await parts.getByRole('button', { name: 'Add part' }).click()
  await expect(parts.getByText(number)).toBeVisible()
}

test('past 80 % and 100 % offline, ask, the fleet approves, new limit on the phone, amount at sign-off', async ({ browser }) => {
  test.slow()
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signInSynced(page, 'mech1@wayside.test')
  await page.goto(`/m/calls/${callId}`)
  const estimate = page.getByTestId('estimate')
  await expect(estimate).toHaveAttribute('data-state', 'ok')
  const sofar = cents(await page.getByTestId('estimate-sofar').textContent())
  expect(sofar).toBeGreaterThan(0)

  // No signal from here: the estimate works from the rates and records on the phone.
  await ctx.setOffline(true)
  const f = await partFactor()
  await addPart(page, 'RAD-90', ((0.9 * LIMIT - sofar) / f / 100).toFixed(2), 'Radiator assembly')
  await expect(estimate).toHaveAttribute('data-state', 'warn')
  await expect(page.getByTestId('estimate-state')).toContainText('Near the limit')
  await page.getByTestId('estimate').scrollIntoViewIfNeeded()
  await shot(page, 'estimate-warn-offline-360')
  await addPart(page, 'FAN-12', ((0.2 * LIMIT) / f / 100).toFixed(2), 'Fan clutch')
  await expect(estimate).toHaveAttribute('data-state', 'stop')
  await expect(page.getByTestId('estimate-state')).toContainText('Limit reached')
  await shot(page, 'estimate-stop-offline-360')

  // The stop opens the request: the diagnosis, what is still needed, the new total.
  const ask = page.getByRole('form', { name: 'Ask the fleet for more' })
  await ask.getByLabel('What you found, in a line').fill('Radiator core cracked; fan clutch seized')
  await ask.getByLabel('Labor still needed, hours').fill('1.5')
  await expect(page.getByTestId('request-total')).toContainText('$')
  await ask.getByRole('button', { name: 'Send to the fleet' }).click()
  await expect(page.getByTestId('estimate-waiting')).toBeVisible()
  await shot(page, 'estimate-waiting-offline-360')
  expect(await count('approval_requests', 'call_id = $1', [callId])).toBe(0)

  // Back in signal: the request travels with the outbox.
  await ctx.setOffline(false)
  await expect.poll(() => count('approval_requests', 'call_id = $1', [callId]), { timeout: 30_000 }).toBe(1)

  // The dispatcher: the call waits for approval at the top of the board, and a link for the fleet.
  const office = await browser.newContext({ viewport: { width: 1280, height: 900 } })
  const desk = await office.newPage()
  await signIn(desk, 'dispatch@wayside.test')
  await desk.goto('/dispatch')
  const firstRow = desk.locator('tbody tr').first()
  await expect(firstRow).toContainText('Waiting for approval')
  await expect(firstRow).toContainText(String(callNumber))
  await shot(desk, 'estimate-board-waiting')
  await desk.goto(`/calls/${callId}`)
  const panel = desk.getByTestId('call-approvals')
  await expect(panel).toContainText('Radiator core cracked')
  await panel.getByRole('button', { name: 'Make a link to copy' }).click()
  const url = await panel.getByTestId('approval-link').textContent()
  expect(url).toMatch(/\/a\/[\w-]{43}$/)
  await shot(desk, 'estimate-office-call')

  // The fleet, on its own phone, without an account.
  const fleetCtx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const fleet = await fleetCtx.newPage()
  await fleet.goto(new URL(url!).pathname)
  await expect(fleet.getByRole('heading', { level: 1 })).toContainText('Approval needed')
  await expect(fleet.getByTestId('fleet-estimate')).toContainText('Radiator')
  await shot(fleet, 'estimate-fleet-page-360')
  await fleet.getByLabel('Your name').fill('Dana Whitfield')
  await fleet.getByLabel('PO number for this work').fill('PF-7781')
  await fleet.getByRole('button', { name: /^Approve/ }).click()
  await expect(fleet.getByTestId('fleet-answered')).toContainText('Approved up to')
  await shot(fleet, 'estimate-fleet-approved-360')
  const { rows: [row] } = await testPool().query('SELECT auth_limit_cents, po_number FROM calls WHERE id = $1', [callId])
  expect(row.po_number).toBe('PF-7781')
  expect(row.auth_limit_cents).toBeGreaterThan(LIMIT)

  // The phone learns it on its next pull, with a clear sign.
  await page.goto('/m/sync')
  await page.getByRole('button', { name: 'Sync now' }).click()
  await expect(page.getByTestId('last-sync')).not.toHaveText('never')
  await page.goto(`/m/calls/${callId}`)
  await expect(page.getByTestId('approval-news')).toContainText('Approved: new limit')
  await expect(page.getByTestId('approval-news')).toContainText('PF-7781')
  const dollars = (row.auth_limit_cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2 })
  await expect(page.getByTestId('estimate-limit')).toHaveText(`$${dollars}`)
  await page.getByTestId('estimate').scrollIntoViewIfNeeded()
  await shot(page, 'estimate-approved-360')

  // The driver signs beneath the work and the hours; an account customer's amount goes on the fleet's invoice.
  const summary = page.getByTestId('signoff-summary')
  await summary.scrollIntoViewIfNeeded()
  await expect(page.getByTestId('signoff-hours')).toContainText(' min')
  await expect(summary).toContainText('The amount goes on the invoice to Prairie Cold Haul')
  await expect(page.getByTestId('signoff-amount')).toHaveCount(0)
  await shot(page, 'estimate-signoff-amount-360')
  await Promise.all([ctx.close(), office.close(), fleetCtx.close()])
})
