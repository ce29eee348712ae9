import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

test('the office bills a finished call: draft, e-mail, post to the fleet account', async ({ page }) => {
  await signIn(page, 'office@wayside.test')
  const ready = page.getByRole('table', { name: /waiting to be billed/ })
  const row = ready.getByRole('row').filter({ hasText: 'Ironwood Freight Lines' }).first()
  await row.getByRole('button', { name: 'Draft invoice' }).click()
  await expect(page).toHaveURL(/\/billing\/invoices\//)
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Ironwood Freight Lines')
  await expect(page.getByRole('cell', { name: /^Labor( after hours)? \d+\.\d h/ }).first()).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/billing-invoice-1280.png', fullPage: true })

  await page.getByRole('button', { name: 'Send by e-mail' }).click()
  await expect(page.getByText('Sent to payables@ironwood-freight.test')).toBeVisible()
  await page.getByRole('button', { name: 'Post to account' }).click()
  await expect(page.getByText(/by charge to account on/)).toBeVisible()
  await expect(page.getByText('Paid', { exact: true })).toBeVisible()
})
