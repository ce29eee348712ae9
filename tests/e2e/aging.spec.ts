import { mkdirSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import { signIn } from './helpers'

const SHOTS = 'tests/e2e/screenshots'

test('the office sees what each fleet owes by days past due, and sorts it', async ({ page }) => {
  test.setTimeout(180_000)
  mkdirSync(SHOTS, { recursive: true })
  await page.setViewportSize({ width: 1280, height: 900 })
  await signIn(page, 'office@wayside.test')
  await page.goto('/billing')
  const aging = page.getByRole('region', { name: /Fleet accounts/ })
  const table = aging.getByRole('table')
  // The demo's sent invoice to Bluestem fell due two days ago: 1–30 days late.
  const bluestem = table.getByRole('row').filter({ hasText: 'Bluestem' })
  await expect(bluestem).toBeVisible()
  await expect(bluestem.getByRole('cell').nth(2)).toHaveText(/^\$[\d,]+\.\d\d$/)
  await table.getByRole('button', { name: /^Customer/ }).click()
  await expect(table.getByRole('columnheader', { name: /Customer/ })).toHaveAttribute('aria-sort', 'ascending')
  await aging.screenshot({ path: `${SHOTS}/billing-aging-1280.png` })

  // Bluestem's statement: the PDF opens; the e-mail asks where it goes first, then is queued.
  const pdf = bluestem.getByRole('link', { name: /Statement PDF for Bluestem/ })
  await expect(pdf).toHaveAttribute('href', /\/api\/billing\/statements\/.+\/pdf$/)
  await bluestem.getByRole('button', { name: /E-mail the statement to Bluestem/ }).click()
  const to = bluestem.getByLabel('Send the statement to')
  await expect(to).not.toHaveValue('')
  await to.fill('not an address')
  await bluestem.getByRole('button', { name: 'Send statement' }).click()
  await expect(bluestem.getByText('Enter an e-mail address like ap@fleet.example')).toBeVisible()
  await to.fill('ap@bluestem.example')
  await bluestem.getByRole('button', { name: 'Send statement' }).click()
  await expect(bluestem.getByRole('status')).toHaveText('Statement queued to ap@bluestem.example.')
  await aging.screenshot({ path: `${SHOTS}/billing-statement-sent-1280.png` })
})
