import { mkdirSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

const SHOTS = 'tests/e2e/screenshots'

test('the admin keeps a truck\'s stock: adds a line, corrects a count with a reason, moves parts to another truck', async ({ page }) => {
  test.setTimeout(240_000)
  mkdirSync(SHOTS, { recursive: true })
  await page.setViewportSize({ width: 1280, height: 900 })
  await signIn(page, 'admin@wayside.test')
  await page.goto('/setup')
  await page.getByRole('link', { name: /Service trucks/ }).click()
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Service trucks and their stock')
  await page.getByRole('link', { name: 'Truck 11', exact: true }).click()
  await expect(page.getByRole('heading', { name: 'Stock on Truck 11' })).toBeVisible()
  // The demo calls used three DEF jugs of six: below the minimum of four.
  const def = page.getByRole('row').filter({ hasText: 'TR-DEF-10' })
  await expect(def.getByText('below minimum')).toBeVisible()

  // A new line.
  await page.getByText('Add a stock line').click()
  await page.getByLabel('Part number').fill('TR-LAMP-4')
  await page.getByLabel('Description').fill('Marker lamp, amber, sealed LED')
  await page.getByLabel('Bin (optional)').fill('D3')
  await page.getByLabel('On hand').fill('6')
  await page.getByLabel('Minimum (restock below)').fill('2')
  await page.getByLabel('Cost each ($)').fill('7.40')
  await page.getByLabel('Price each ($)').fill('14.95')
  await page.getByRole('button', { name: 'Add line' }).click()
  const lamp = page.getByRole('row').filter({ hasText: 'TR-LAMP-4' }).first()
  await expect(lamp).toContainText('$14.95')

  // A count needs its reason.
  await lamp.getByRole('button', { name: 'Correct count' }).click()
  await page.getByLabel(/Counted on the truck/).fill('5')
  await page.getByRole('button', { name: 'Save count' }).click()
  await expect(page.getByText('Say why (kept in the stock log)')).toBeVisible()
  await page.getByLabel('Reason (kept in the stock log)').fill('One broken in the bin at the yard check')
  await page.getByRole('button', { name: 'Save count' }).click()
  const log = page.getByRole('region', { name: 'Stock log' })
  const countRow = log.getByRole('row').filter({ hasText: 'One broken in the bin' })
  await expect(countRow).toContainText('Count corrected')
  await expect(countRow).toContainText('6 → 5')
  await expect(countRow).toContainText('Ada Okafor')

  // A move to Truck 12 with its reason.
  await lamp.getByRole('button', { name: 'Move to a truck' }).click()
  await page.getByLabel(/How many to move/).fill('2')
  await page.getByLabel('To truck').selectOption({ label: 'Truck 12' })
  await page.getByLabel('Reason (kept in the stock log)').fill('Truck 12 covers the night shift')
  await page.getByRole('button', { name: 'Move parts' }).click()
  await expect(log.getByRole('row').filter({ hasText: 'Moved to Truck 12' })).toContainText('5 → 3')
  await expect(page.getByRole('row').filter({ hasText: 'TR-LAMP-4' }).first().getByRole('cell').nth(3)).toHaveText('3')
  await page.screenshot({ path: `${SHOTS}/trucks-1280.png`, fullPage: true })

  await page.getByRole('link', { name: 'Truck 12', exact: true }).click()
  await expect(page.getByRole('heading', { name: 'Stock on Truck 12' })).toBeVisible()
  await expect(log.getByRole('row').filter({ hasText: 'Moved in from Truck 11' })).toContainText('0 → 2')

  // The restock list, for print.
  await page.getByRole('link', { name: 'Restock list' }).click()
  await expect(page.getByRole('heading', { name: 'Truck 11' })).toBeVisible()
  await expect(page.getByRole('row').filter({ hasText: 'TR-DEF-10' }).first()).toContainText('Floor')
  await page.emulateMedia({ media: 'print' })
  await page.screenshot({ path: `${SHOTS}/restock-print.png`, fullPage: true })
})
