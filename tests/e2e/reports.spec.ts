import { mkdirSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

const SHOTS = 'tests/e2e/screenshots'

test('the office reads each report in words, as a chart and a table, in both themes and on paper', async ({ page }) => {
  test.setTimeout(240_000)
  mkdirSync(SHOTS, { recursive: true })
  await page.setViewportSize({ width: 1280, height: 900 })
  await signIn(page, 'office@wayside.test')
  await page.goto('/reports')
  await expect(page.getByRole('heading', { level: 1 })).toHaveText('Reports')

  await page.getByLabel('Report').selectOption({ label: 'How finished calls ended' })
  const table = page.getByRole('table')
  await expect(table.getByRole('columnheader', { name: 'Outcome' })).toBeVisible()
  await expect(table.getByRole('columnheader', { name: 'Share' })).toBeVisible()
  // Outcomes in words, never the stored value.
  await expect(table.getByRole('cell', { name: 'Repaired at the roadside' })).toBeVisible()
  await expect(page.locator('main')).not.toContainText('_')
  await expect(page.getByRole('img', { name: /How finished calls ended: calls by outcome/ })).toBeVisible()
  await expect(page.getByRole('link', { name: 'Download CSV' })).toHaveAttribute('href', /\/api\/reports\/fix-rate\/csv\?from=/)

  await page.getByLabel('Report').selectOption({ label: 'Response times' })
  await expect(table.getByRole('columnheader', { name: 'Minutes to assign (median)' })).toBeVisible()
  await expect(page.locator('main')).not.toContainText(/Median To Assign|medianToAssignMin/)

  await page.getByLabel('Report').selectOption({ label: 'Mechanics by week' })
  await expect(table.getByRole('columnheader', { name: 'First-visit fix rate' })).toBeVisible()
  await expect(table.getByRole('columnheader', { name: 'Hours worked' })).toBeVisible()
  await expect(page.getByRole('img', { name: /Mechanics by week/ })).toBeVisible()
  await page.screenshot({ path: `${SHOTS}/reports-sunlight-1280.png`, fullPage: true })

  await page.getByRole('button', { name: 'Night' }).click()
  await expect(page.locator('html')).toHaveClass(/theme-night/)
  await page.screenshot({ path: `${SHOTS}/reports-night-1280.png`, fullPage: true })

  await page.emulateMedia({ media: 'print' })
  await page.screenshot({ path: `${SHOTS}/reports-print.png`, fullPage: true })
})
