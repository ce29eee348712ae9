// The call page read with a gloved thumb at 360 px: the next-step button under the header walks a card
// customer's call from assigned to the driver's sign-off (the status steps taken by the button itself, the
// other steps by the sections it goes to), the section bar shows every name whole, a part shows the
// customer's price (cost plus the shop's markup, as the invoice charges), "Mark cleared" waits for the
// repair, and the driver signs beneath the work, the hours, the parts and the amount.
import { randomUUID } from 'node:crypto'
import { expect, test, type Locator, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'
import { drawSignature, signInSynced, PHONE } from './helpers'

const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png` })
const shotOf = (where: Locator, name: string) => where.screenshot({ path: `tests/e2e/screenshots/${name}.png` })

let callId: string
test.beforeAll(async () => {
  const db = testPool()
  callId = randomUUID()
  await db.query(`INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id, assigned_at)
    VALUES ($1, 'assigned', $2, $3, 'Hwy 8 eastbound at the weigh station', 'Coolant temperature gauge pegged hot', $4, now())`,
  [callId, seedId('customer:vossberg'), seedId('unit:7'), seedId('user:mech1')])
  await db.query(`INSERT INTO call_events (call_id, kind, to_status, mechanic_id) VALUES ($1, 'assigned', 'assigned', $2)`,
    [callId, seedId('user:mech1')])
})

test('at 360 px the next-step button walks a call from assigned to the driver\'s sign-off', async ({ browser }) => {
  test.slow()
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signInSynced(page, 'mech1@wayside.test')
  await page.goto(`/m/calls/${callId}`)
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Call #')

  // The section bar: every name whole inside the 360 px screen, none scrolled out of sight.
  const bar = page.getByRole('navigation', { name: 'Sections of this call' })
  const names = bar.getByRole('button')
  await expect(names).toHaveCount(12)
  for (const b of await names.all()) {
    const box = (await b.boundingBox())!
    expect(box.x).toBeGreaterThanOrEqual(0)
    expect(box.x + box.width).toBeLessThanOrEqual(PHONE.width)
    // The text fits its button: nothing cut at the edge.
    expect(await b.evaluate(el => el.scrollWidth <= el.clientWidth)).toBe(true)
  }
  await shot(page, 'field-next-step-top-360')
  // Clear of the bar fixed at the bottom of the screen for its picture.
  await bar.evaluate(el => el.scrollIntoView({ block: 'center' }))
  await shotOf(bar, 'field-jump-nav-360')
  await page.evaluate(() => window.scrollTo(0, 0))

  const next = page.getByTestId('next-step')
  const button = next.getByRole('button')
  const section = (heading: string) => page.locator(`section[aria-labelledby="${heading}"]`)
  // The button sits right under the header, at least 56 px tall and the screen's width less the margins.
  const size = (await button.boundingBox())!
  expect(size.height).toBeGreaterThanOrEqual(56)
  expect(size.width).toBeGreaterThanOrEqual(PHONE.width - 40)

  // Status steps, taken by the button itself.
  await expect(next).toHaveAttribute('data-step', 'drive')
  await button.click()
  await expect(page.getByRole('listitem').filter({ hasText: 'Driving out' }).first()).toHaveAttribute('aria-current', 'step')
  await expect(next).toHaveAttribute('data-step', 'arrive')
  await expect(button).toContainText('Mark arrived')
  await button.click()
  await expect(next).toHaveAttribute('data-step', 'scene')

  // The scene: the button goes to the checklist and puts the focus there.
  await button.click()
  await expect(section('scene-title')).toBeFocused()
  for (const box of await page.getByRole('region', { name: 'Every call' }).getByRole('checkbox').all()) await box.check()
  await expect(next).toHaveAttribute('data-step', 'work', { timeout: 10_000 })
  await page.evaluate(() => window.scrollTo(0, 0))
  await button.click()
  await expect(page.getByText('Labor · running')).toBeVisible()

  // The codes; "Mark cleared" waits for the repair.
  await expect(next).toHaveAttribute('data-step', 'codes')
  await button.click()
  const codes = section('codes-title')
  await expect(codes).toBeFocused()
  await codes.getByRole('button', { name: 'Add a fault code' }).click()
  await codes.getByLabel('SPN', { exact: true }).fill('110')
  await codes.getByLabel('FMI', { exact: true }).selectOption('0')
  await codes.getByRole('button', { name: 'Add fault code' }).click()
  const code = codes.getByRole('article', { name: 'Fault code SPN 110 FMI 0' })
  await expect(code.getByTestId('clear-after-repair')).toContainText('comes after the repair')
  await expect(code.getByRole('button', { name: /Mark cleared/ })).toHaveCount(0)

  // A card customer: the driver signs the estimate before the repair.
  await expect(next).toHaveAttribute('data-step', 'estimate')
  await expect(button).toContainText('Have the driver sign the estimate')
  await page.evaluate(() => window.scrollTo(0, 0))
  await button.click()
  await expect(page.getByTestId('presign')).toBeFocused()
  const form = page.getByRole('form', { name: 'The estimate to sign' })
  await form.getByLabel('What will be done, in a line').fill('Replace the coolant temperature sensor')
  await form.getByLabel('Labor expected, hours').fill('1.5')
  await form.getByLabel('Part no.').fill('TR-ECT-10K')
  await form.getByLabel('What the part is').fill('Coolant temperature sensor')
  await form.getByLabel('Price each, before markup').fill('120.00')
  await form.getByRole('button', { name: 'Add this part to the estimate' }).click()
  await form.getByLabel('Name of the driver signing').fill('Rolf Vossberg')
  await drawSignature(page, 'estimate-signature-pad')
  await form.getByRole('button', { name: 'Sign the estimate' }).click()
  await expect(page.getByTestId('presign')).toHaveAttribute('data-need', 'signed')

  // The repair: the part at the customer's price, the invoice's (cost plus the shop's markup from the rates in force).
  await expect(next).toHaveAttribute('data-step', 'repair')
  await page.evaluate(() => window.scrollTo(0, 0))
  await button.click()
  const parts = section('parts-title')
  await expect(parts).toBeFocused()
  const { rows: [rates] } = await testPool().query('SELECT parts_markup_pct AS pct FROM rates ORDER BY effective_from DESC LIMIT 1')
  // Markup on cost: $120.00 × (100 + markup) / 100 (common practice for parts resale).
  const each = `$${(120 * (100 + Number(rates.pct)) / 100).toFixed(2)}`
  await parts.getByRole('button', { name: 'Add a part' }).click()
  await parts.getByLabel('Part number').fill('TR-ECT-10K')
  await parts.getByLabel('Description').fill('Coolant temperature sensor')
  await parts.getByLabel('Quantity').fill('1')
  await parts.getByLabel('Unit price').fill('120.00')
  await expect(parts.getByTestId('part-form-customer-price')).toContainText(`Customer pays ${each} each`)
  await shotOf(parts, 'field-part-form-price-360')
  await parts.getByRole('button', { name: 'Add part' }).click()
  await expect(parts.getByTestId('part-customer-price')).toContainText(`Customer pays ${each} each`)
  await shotOf(parts, 'field-part-price-360')
  // With a repair on record the code can be marked cleared.
  await code.getByRole('button', { name: 'Mark cleared after the repair' }).click()
  await expect(code).toContainText('Cleared')

  // The story, then the proof.
  await expect(next).toHaveAttribute('data-step', 'story')
  await page.evaluate(() => window.scrollTo(0, 0))
  await button.click()
  await expect(section('story-title')).toBeFocused()
  await page.getByLabel(/^Cause/).fill('Coolant temperature sensor open circuit, 1.2 MΩ at 20 °C.')
  await page.getByLabel(/^Correction/).fill('Replaced the coolant temperature sensor, bled the system.')
  await page.getByRole('button', { name: 'Save the story' }).click()
  await expect(next).toHaveAttribute('data-step', 'verify')
  await page.evaluate(() => window.scrollTo(0, 0))
  await button.click()
  await expect(section('verify-title')).toBeFocused()
  await page.getByLabel('Fault codes cleared and not back').check()
  await page.getByLabel(/Live values re-read/).check()
  await page.getByLabel('Warning lamps off').check()
  await page.getByLabel(/Derate gone/).check()
  await page.getByLabel(/^Distance/).fill('6')
  await page.getByRole('button', { name: 'Save the checks' }).click()

  // Finish: the button opens the outcome question where the Progress section asks it.
  await expect(next).toHaveAttribute('data-step', 'finish')
  await page.evaluate(() => window.scrollTo(0, 0))
  await button.click()
  await page.getByRole('button', { name: 'Repaired at the roadside' }).click()
  await expect(page.getByText('Work done: Repaired at the roadside')).toBeVisible()

  // The driver signs beneath the work, the hours, the parts and the amount.
  await expect(next).toHaveAttribute('data-step', 'signoff')
  await page.evaluate(() => window.scrollTo(0, 0))
  await button.click()
  const signoff = section('sign-title')
  await expect(signoff).toBeFocused()
  const summary = signoff.getByTestId('signoff-summary')
  await expect(summary).toContainText('Cause: Coolant temperature sensor open circuit')
  await expect(summary).toContainText('Correction: Replaced the coolant temperature sensor')
  await expect(summary.getByRole('list', { name: 'Parts fitted' })).toContainText('TR-ECT-10K × 1')
  await expect(summary.getByTestId('signoff-hours')).toContainText(/travel \d+ min · labor \d+ min/)
  await expect(summary.getByTestId('signoff-amount')).toContainText(/Amount so far: \$[\d,]+\.\d\d/)
  // The summary sits above the signature.
  const above = (await summary.boundingBox())!.y < (await signoff.getByTestId('signature-pad').boundingBox())!.y
  expect(above).toBe(true)
  await shotOf(summary, 'field-signoff-summary-360')
  await signoff.getByLabel('Driver\'s name').fill('Rolf Vossberg')
  await drawSignature(page, 'signature-pad')
  await signoff.getByRole('button', { name: 'Save sign-off' }).click()
  await expect(signoff.getByTestId('signed')).toContainText('Rolf Vossberg')
  await shotOf(signoff, 'field-signoff-signed-360')

  // Last: sync, by the button if the phone has not synced by itself already, then nothing is left.
  await page.evaluate(() => window.scrollTo(0, 0))
  await expect(next).toHaveAttribute('data-step', /sync|done/)
  if (await next.getAttribute('data-step') === 'sync') await button.click()
  await expect(next).toHaveAttribute('data-step', 'done', { timeout: 30_000 })
  await shot(page, 'field-next-step-done-360')
  const { rows: [call] } = await testPool().query('SELECT status, outcome FROM calls WHERE id = $1', [callId])
  expect(call).toEqual({ status: 'completed', outcome: 'repaired' })
  await ctx.close()
})
