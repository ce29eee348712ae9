// The phone and its sync, as the mechanic sees them at 360 px: the card library arrives with the
// first sync alone, and the phone tells the truth about what waits, what is to settle and the signal.
import { expect, test, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { count, testPool } from '../support/db'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

const CALL_5 = seedId('call:c5') // on site, SPN 3242 FMI 4, assigned to mech2 (server/db/seed/core.ts)
const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })

/** Signs in on a phone and waits for the first sync to finish, without opening any other page. */
async function firstSync(page: Page, email: string) {
  await signIn(page, email)
  await waitForServiceWorker(page)
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sync' }).click()
  await expect(page.getByTestId('last-sync')).not.toHaveText('never', { timeout: 30_000 })
}

test('every card is on the phone after the first sync, with no card page opened online', async ({ browser }) => {
  test.slow()
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  const cardRequests: string[] = []
  page.on('request', (r) => { if (r.url().includes('/api/test-cards')) cardRequests.push(r.url()) })
  await firstSync(page, 'mech2@wayside.test')

  await ctx.setOffline(true)
  await page.goto(`/m/calls/${CALL_5}`)
  await expect(page.getByRole('heading', { level: 1, name: 'Call #5' })).toBeVisible()
  await expect(page.getByTestId('no-signal')).toBeVisible()
  await page.getByRole('link', { name: /Run a test card/ }).click()
  const active = await count('test_cards', 'active')
  const listed = page.locator('section[aria-labelledby="suggested-title"] a, section[aria-labelledby="all-title"] a')
  await expect(listed).toHaveCount(active)
  await shot(page, 'field-sync-cards-offline-360')
  // Every card opens with no signal, not only the one the codes suggest.
  const titles = (await listed.locator('span.font-bold').allTextContents()).map(t => t.trim())
  expect(titles).toHaveLength(active)
  for (const [i, title] of titles.entries()) {
    await listed.nth(i).click()
    await expect(page.getByRole('heading', { level: 1 })).toHaveText(title)
    await expect(page.getByText('This card is not on the phone')).toHaveCount(0)
    await shot(page, `field-sync-card-${i + 1}-offline-360`)
    await page.goBack()
    await expect(listed).toHaveCount(active)
  }
  await page.getByRole('region', { name: 'Fits this call\'s codes' }).getByRole('link', { name: /Exhaust temperature sensor/ }).click()
  await expect(page.getByRole('heading', { level: 1, name: /Exhaust temperature sensor/ })).toBeVisible()
  await expect(page.getByRole('heading', { name: 'Before you start' })).toBeVisible()
  // One path: the library came with the sync, never from the card routes.
  expect(cardRequests).toEqual([])
  await ctx.close()
})

test('the chip leads to what waits to be settled, and on which call', async ({ browser }) => {
  test.slow()
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await firstSync(page, 'mech2@wayside.test')
  const chip = page.getByTestId('sync-chip')
  // Nothing to settle on a fresh sign-in: the chip is quiet and the panel says nothing waits.
  await expect(chip).toHaveAttribute('data-state', 'sent')
  await expect(page.getByTestId('to-settle')).toHaveCount(0)
  await shot(page, 'field-sync-panel-360')
  await page.goto('/m')
  await expect(page.getByRole('heading', { level: 1, name: 'My calls' })).toBeVisible()
  await shot(page, 'field-calls-360')

  // The office changed the cause while this phone had changed it too.
  const { rows: [conflict] } = await testPool().query(
    `INSERT INTO conflicts (call_id, entity, entity_id, field, base_value, device_value, server_value, reason)
     VALUES ($1, 'call', $1, 'storyCause', 'null', '"Sensor open"', '"Harness chafed"', `
    + `'Changed on the phone and in the office') RETURNING id`,
    [CALL_5],
  )
  try {
    await page.getByRole('button', { name: /Sync now/ }).click()
    await expect(chip).toHaveAttribute('data-state', 'settle', { timeout: 30_000 })
    await expect(chip).toContainText('1 to settle')
    await page.locator('header').screenshot({ path: 'tests/e2e/screenshots/field-chip-settle-360.png' })
    await chip.click()
    const settle = page.getByTestId('to-settle')
    await expect(settle).toContainText('Call #5: cause')
    await expect(page.getByTestId('waiting-count')).toContainText('Everything has reached the office')
    await shot(page, 'field-sync-settle-360')
    await settle.getByRole('link', { name: 'Open call #5' }).click()
    await expect(page.getByRole('article', { name: 'Conflict on Cause' })).toBeVisible()
  }
  finally {
    await testPool().query('UPDATE conflicts SET status = \'resolved\', choice = \'server\' WHERE id = $1', [conflict.id])
  }
  await ctx.close()
})

test('no signal follows the network, and Sync now with no signal says it waits and why', async ({ browser }) => {
  test.slow()
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await firstSync(page, 'mech2@wayside.test')
  const chip = page.getByTestId('sync-chip')
  await expect(page.getByTestId('no-signal')).toHaveCount(0)

  // Opened with no signal: the screens run on the person remembered on the phone.
  await ctx.setOffline(true)
  await page.goto('/m')
  await expect(page.getByRole('heading', { level: 1, name: 'My calls' })).toBeVisible()
  await expect(page.getByTestId('no-signal')).toBeVisible()
  // The chip tells what the phone holds, the header the signal: "No signal" is said once.
  await expect(chip).toHaveAttribute('data-state', 'sent')
  await expect(page.locator('header').getByText('No signal')).toHaveCount(1)
  await page.getByRole('button', { name: /Sync now/ }).click()
  await expect(page.getByTestId('sync-notice')).toContainText('No signal, so nothing can be sent now')
  await shot(page, 'field-no-signal-360')

  // Signal back: the header says so at once, without a reload.
  await ctx.setOffline(false)
  await expect(page.getByTestId('no-signal')).toHaveCount(0, { timeout: 15_000 })
  await expect(chip).toHaveAttribute('data-state', 'sent')
  await expect(page.getByTestId('sync-notice')).toHaveCount(0)
  await page.locator('header').screenshot({ path: 'tests/e2e/screenshots/field-chip-back-online-360.png' })
  await ctx.close()
})

test('a value the server would refuse is refused on the phone, beside its field', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await firstSync(page, 'mech2@wayside.test')
  await page.goto(`/m/calls/${CALL_5}`)
  await page.getByRole('button', { name: 'Add a part' }).click()
  await page.getByLabel('Part number').fill('TR-DEF-10')
  await page.getByLabel('Description').fill('DEF jug')
  await page.getByLabel('Unit price').fill('2000000')
  await page.getByRole('button', { name: 'Add part' }).click()
  const price = page.getByLabel('Unit price')
  await expect(price).toHaveAttribute('aria-invalid', 'true')
  const describedBy = await price.getAttribute('aria-describedby')
  await expect(page.locator(`#${describedBy}`)).toHaveText('Unit price must be from 0.00 to 1000000.00')
  await expect(page.getByTestId('sync-chip')).toHaveAttribute('data-waiting', '0')
  await page.locator('section[aria-labelledby="parts-title"]').screenshot({ path: 'tests/e2e/screenshots/field-part-refused-360.png' })
  await ctx.close()
})
