import { readFileSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import Papa from 'papaparse'
import { signIn } from './helpers'

test('the office downloads invoices and payments as CSV from the billing page', async ({ page }) => {
  test.setTimeout(180_000)
  await signIn(page, 'office@wayside.test')
  await page.goto('/billing')
  const exports = page.getByRole('region', { name: 'Export for accounting' })
  // At most a year at a time; the demo calls were all billed within it.
  await exports.getByLabel('From').fill(new Date(Date.now() - 360 * 86_400_000).toISOString().slice(0, 10))
  for (const [link, first] of [['Invoices (CSV)', 'Invoice number'], ['Payments (CSV)', 'Received']] as const) {
    const download = page.waitForEvent('download')
    await exports.getByRole('link', { name: link }).click()
    const file = await (await download).path()
    const parsed = Papa.parse<string[]>(readFileSync(file, 'utf8'), { skipEmptyLines: true })
    expect(parsed.data[0]![0]).toBe(first)
    expect(parsed.data.length).toBeGreaterThan(1)
  }
  await exports.getByLabel('From').fill('2030-01-01')
  await expect(exports.getByRole('alert')).toContainText('on or before')
})
