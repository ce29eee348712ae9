// A road-service owner's day at the desk: a second call for a unit that has one open, the
// mechanic's phone to tap, how old each mechanic's position is, the shift switch on the board and
// on the phone, and the invoice with the story and the driver's signature.
import { mkdirSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'
import { PHONE, signIn } from './helpers'

const DESK = { width: 1280, height: 800 }
const SHOTS = 'tests/e2e/screenshots'
const MECH1 = seedId('user:mech1')
const MECH4 = seedId('user:mech4')

test.beforeAll(() => {
  mkdirSync(SHOTS, { recursive: true })
})

test('a call for a unit with an open call warns and links it; the call page offers the mechanic\'s phone and the position\'s age',
  async ({ browser }) => {
    const db = testPool()
    const { rows: [c1] } = await db.query('SELECT id, number FROM calls WHERE id = $1', [seedId('call:c1')])
    // Marco's phone last reported 8 minutes ago.
    await db.query('UPDATE users SET last_position_at = now() - interval \'8 minutes 10 seconds\' WHERE id = $1', [MECH1])
    const ctx = await browser.newContext({ viewport: DESK })
    const page = await ctx.newPage()
    await signIn(page, 'dispatch@wayside.test')
    await page.goto('/dispatch/new')
    await page.getByRole('button', { name: 'Start over' }).click()

    const customer = page.getByRole('combobox', { name: 'Customer', exact: true })
    await customer.fill('Prairie')
    await page.getByRole('option', { name: /Prairie Cold Haul/ }).click()
    await page.getByLabel('Call-back number').fill('(612) 555-0177')
    const unit = page.getByRole('combobox', { name: 'Unit', exact: true })
    await unit.fill('PR-149')
    await page.getByRole('option', { name: /^PR-149 / }).click()
    // Unit 7 already has call c1 open: said before the call is taken, with a link to it.
    const warning = page.getByTestId('unit-open-calls')
    await expect(warning).toContainText(`This unit has another open call: #${c1.number}`)
    await expect(warning.getByRole('link', { name: `Call #${c1.number}` })).toHaveAttribute('href', `/calls/${c1.id}`)
    await expect(warning).toContainText('Check-engine lamp on')
    await page.getByLabel('Where is the truck').fill('Route 8 eastbound, mile 43')
    await page.getByLabel('Latitude').fill('45.29')
    await page.getByLabel('Longitude').fill('-93.1')
    await page.getByLabel('Complaint, in the driver\'s words').fill('Same truck: now the air dryer purges constantly')
    await page.screenshot({ path: `${SHOTS}/desk-day-new-call-warning-1280.png`, fullPage: true })
    await page.getByRole('button', { name: 'Take call' }).click()
    await expect(page).toHaveURL(/\/calls\/[0-9a-f-]{36}$/)

    // The call page says it again, linking the other call.
    const again = page.getByTestId('unit-open-calls')
    await expect(again).toContainText(`This unit has another open call: #${c1.number}`)
    await expect(again.getByRole('link', { name: `Call #${c1.number}` })).toHaveAttribute('href', `/calls/${c1.id}`)

    // The suggestions say how old each position is beside the distance.
    const panel = page.getByRole('region', { name: 'Send a mechanic' })
    const marco = panel.getByRole('listitem').filter({ hasText: 'Marco Lindqvist' })
    await expect(marco).toContainText(/\d+(\.\d)? km, about \d+ min · position 8 min old/)
    await expect(panel.getByRole('listitem').filter({ hasText: 'Levi Castellanos' })).toContainText('position unknown')
    await page.screenshot({ path: `${SHOTS}/desk-day-call-suggestions-1280.png`, fullPage: true })
    await marco.getByRole('button', { name: 'Assign Marco Lindqvist' }).click()
    await expect(page.getByText('Marco Lindqvist has the call')).toBeVisible()

    // The mechanic's phone as a number to tap, never the e-mail; the caller's number too.
    const details = page.getByRole('region', { name: 'Call details' })
    await expect(details.getByRole('link', { name: 'Call Marco: 555-0151' })).toHaveAttribute('href', 'tel:5550151')
    await expect(details).not.toContainText('mech1@wayside.test')
    await expect(details.getByRole('link', { name: '(612) 555-0177' })).toHaveAttribute('href', 'tel:6125550177')
    await expect(details.getByRole('link', { name: '555-0172' })).toHaveAttribute('href', 'tel:5550172')
    await details.screenshot({ path: `${SHOTS}/desk-day-call-details.png` })
    await ctx.close()
  })

test('dispatch switches a mechanic off duty on the board; the board at 360 px', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: DESK })
  const page = await ctx.newPage()
  try {
    await signIn(page, 'dispatch@wayside.test')
    await page.goto('/dispatch')
    const duty = page.getByRole('switch', { name: 'Sunniva Adeyemi on duty' })
    await expect(duty).toHaveAttribute('aria-checked', 'true')
    await duty.click()
    await expect(duty).toHaveAttribute('aria-checked', 'false')
    await expect(duty).toHaveText('Off duty')
    const { rows: [row] } = await testPool().query('SELECT on_duty FROM users WHERE id = $1', [MECH4])
    expect(row.on_duty).toBe(false)
    await page.screenshot({ path: `${SHOTS}/desk-day-board-1280.png`, fullPage: true })

    await page.setViewportSize(PHONE)
    await page.reload()
    await expect(page.getByRole('switch', { name: 'Sunniva Adeyemi on duty' })).toHaveAttribute('aria-checked', 'false')
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
    expect(overflow).toBeLessThanOrEqual(0)
    await page.screenshot({ path: `${SHOTS}/desk-day-board-360.png`, fullPage: true })
    await page.getByRole('switch', { name: 'Sunniva Adeyemi on duty' }).click()
    await expect(page.getByRole('switch', { name: 'Sunniva Adeyemi on duty' })).toHaveAttribute('aria-checked', 'true')
  }
  finally {
    await testPool().query('UPDATE users SET on_duty = true WHERE id = $1', [MECH4])
    await ctx.close()
  }
})

test('the mechanic ends and starts a shift from the phone; with no signal it says so', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE })
  const page = await ctx.newPage()
  const MECH2 = seedId('user:mech2')
  try {
    await signIn(page, 'mech2@wayside.test')
    await page.goto('/m')
    const shift = page.getByRole('region', { name: 'Shift' })
    await expect(shift.getByTestId('shift-state')).toHaveText('On duty')
    await shift.getByRole('button', { name: 'End shift' }).click()
    await expect(shift.getByTestId('shift-state')).toHaveText('Off duty')
    const { rows: [row] } = await testPool().query('SELECT on_duty FROM users WHERE id = $1', [MECH2])
    expect(row.on_duty).toBe(false)
    await page.screenshot({ path: `${SHOTS}/desk-day-phone-shift-360.png`, fullPage: true })
    await ctx.setOffline(true)
    await expect(shift.getByRole('button', { name: 'Start shift' })).toBeDisabled()
    await expect(shift).toContainText('needs signal')
    await ctx.setOffline(false)
    await shift.getByRole('button', { name: 'Start shift' }).click()
    await expect(shift.getByTestId('shift-state')).toHaveText('On duty')
  }
  finally {
    await testPool().query('UPDATE users SET on_duty = true WHERE id = $1', [MECH2])
    await ctx.close()
  }
})

test('the invoice page shows the story and the driver\'s sign-off being billed for', async ({ browser }) => {
  const callId = seedId('call:c8')
  const db = testPool()
  // c8 was paid without a signature in the seed; this test's driver signs it.
  const svg = '<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 200 60"><path d="M10 40c20-30 40 30 60 0" stroke="#000" '
    + 'fill="none" stroke-width="3"/></svg>'
  await db.query(
    `INSERT INTO sign_offs (id, call_id, driver_name, signature, created_by) VALUES ($1, $2, 'R. Vossberg', $3, $4)
     ON CONFLICT (call_id) DO NOTHING`,
    [seedId('signoff:desk-day:c8'), callId, `data:image/svg+xml;base64,${Buffer.from(svg).toString('base64')}`, seedId('user:mech2')],
  )
  const { rows: [call] } = await db.query('SELECT story_cause, story_correction FROM calls WHERE id = $1', [callId])
  const ctx = await browser.newContext({ viewport: DESK })
  const page = await ctx.newPage()
  await signIn(page, 'office@wayside.test')
  await page.goto(`/billing/invoices/${seedId('invoice:c8')}`)
  const story = page.getByRole('region', { name: 'Story' })
  await expect(story).toContainText(call.story_correction)
  await expect(story).toContainText(call.story_cause)
  await expect(story.getByRole('img', { name: 'Signature of R. Vossberg' })).toBeVisible()
  await expect(story).toContainText('R. Vossberg')
  await page.screenshot({ path: `${SHOTS}/desk-day-invoice-1280.png`, fullPage: true })
  await ctx.close()
})
