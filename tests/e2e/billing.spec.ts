import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

const SHOTS = 'tests/e2e/screenshots'

test.setTimeout(600_000)

test('the office adjusts a draft with a reason, sends it to the address it confirms, and posts it to the account', async ({ page }) => {
  mkdirSync(SHOTS, { recursive: true })
  mkdirSync('test-results', { recursive: true })
  await signIn(page, 'office@wayside.test')
  const desk = page.getByRole('table', { name: /waiting to be billed/ })
  const row = desk.getByRole('row').filter({ hasText: 'Ironwood Freight Lines' }).filter({ has: page.getByRole('button', { name: 'Draft invoice' }) }).first()
  // The desk says what to look at first, in words.
  await expect(desk.getByText('if drafted now').first()).toBeVisible()
  await page.screenshot({ path: `${SHOTS}/billing-desk-1280.png`, fullPage: true })
  await row.getByRole('button', { name: 'Draft invoice' }).click()
  await expect(page).toHaveURL(/\/billing\/invoices\//)
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Ironwood Freight Lines')

  // Change the labor line: a reason is asked for and logged with the before and after.
  const labor = page.getByRole('row').filter({ hasText: /^Labor/ }).first()
  await labor.getByRole('button', { name: /^Change / }).click()
  const editor = page.getByRole('form', { name: 'Change the line' })
  await editor.getByLabel('Quantity').fill('0.8')
  await editor.getByRole('button', { name: 'Save the change' }).click()
  await expect(editor.getByText('Say why')).toBeVisible()
  await editor.getByLabel(/Reason/).fill('Driver kept us waiting for keys: not billed')
  await editor.getByRole('button', { name: 'Save the change' }).click()
  const log = page.getByRole('region', { name: 'Changes to this draft' })
  await expect(log.getByText('Driver kept us waiting for keys: not billed')).toBeVisible()
  await expect(log.getByText(/After: .* 0\.8 ×/)).toBeVisible()
  await expect(page.getByText('changed by the office').first()).toBeVisible()
  await page.screenshot({ path: `${SHOTS}/billing-invoice-1280.png`, fullPage: true })

  // Sending asks first and shows where it goes.
  await page.getByRole('button', { name: 'Send by e-mail' }).click()
  const ask = page.getByRole('dialog')
  await expect(ask).toContainText('payables@ironwood-freight.test')
  await ask.getByRole('button', { name: 'Send to payables@ironwood-freight.test' }).click()
  // Rendering the PDF and handing it to the mail server can take a while on a busy machine.
  await expect(page.getByText('Sent to payables@ironwood-freight.test')).toBeVisible({ timeout: 180_000 })
  await expect(page.getByRole('button', { name: /^Change / })).toHaveCount(0)

  // The first page of the PDF the fleet receives, rendered for people to look at.
  const pdf = await page.request.get(`${page.url().replace(/\/billing\/invoices\//, '/api/invoices/')}/pdf`)
  expect(pdf.headers()['content-type']).toBe('application/pdf')
  writeFileSync('test-results/invoice.pdf', await pdf.body())
  execFileSync('pdftoppm', ['-png', '-r', '80', '-f', '1', '-l', '1', '-singlefile', 'test-results/invoice.pdf', `${SHOTS}/invoice-pdf-page1`])

  await page.getByRole('button', { name: 'Post to account' }).click()
  await expect(page.getByText(/by charge to account on/)).toBeVisible()
  await expect(page.getByText('Paid', { exact: true })).toBeVisible()
})
