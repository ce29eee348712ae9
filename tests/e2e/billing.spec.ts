import { expect, test } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

test('the office bills a finished call: draft, e-mail, post to the fleet account', async ({ page }) => {
  await signIn(page, 'office@wayside.test')
  const ready = page.getByRole('table', { name: /waiting to be billed/ })
  const row = ready.getByRole('row').filter({ hasText: 'Ironwood Freight Lines' }).first()
  await row.getByRole('button', { name: 'Draft invoice' }).click()
  await expect(page).toHaveURL(/\/billing\/invoices\//)
  await expect(page.getByRole('heading', { level: 1 })).toContainText('Ironwood Freight Lines')
  await expect(page.getByRole('cell', { name: /Labor \d+\.\d h/ })).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/billing-invoice-1280.png', fullPage: true })

  await page.getByRole('button', { name: 'Send by e-mail' }).click()
  await expect(page.getByText('On its way to payables@ironwood-freight.test')).toBeVisible()
  await expect(page.getByRole('region', { name: 'E-mail' }).getByText('Sent', { exact: true })).toBeVisible({ timeout: 20_000 })
  await page.getByRole('button', { name: 'Post to account' }).click()
  await expect(page.getByText(/charge to the fleet's account on/)).toBeVisible()
  await expect(page.getByRole('region', { name: 'Money on this invoice' }).getByText('Paid', { exact: true })).toBeVisible()
})

test('a card customer pays on the hosted page: the mechanic shows the QR code, the payer pays, the invoice shows paid',
  async ({ browser }) => {
    test.setTimeout(240_000)
    const invoiceId = seedId('invoice:c7')
    const callId = seedId('call:c7')

    // The mechanic's phone fetches the link with signal and keeps it for the roadside.
    const phone = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
    const mech = await phone.newPage()
    await signIn(mech, 'mech1@wayside.test')
    await waitForServiceWorker(mech)
    await mech.goto(`/m/calls/${callId}`)
    const pay = mech.getByRole('region', { name: 'Payment' })
    await expect(pay.getByText(/due$/)).toBeVisible({ timeout: 30_000 })
    await expect(pay.getByTestId('pay-qr')).toBeVisible()
    const link = (await pay.getByRole('link').first().textContent())!.trim()
    expect(link).toMatch(/\/pay\/[\w-]{20,}$/)
    await pay.screenshot({ path: 'tests/e2e/screenshots/field-pay-link-360.png' })
    await phone.setOffline(true)
    await mech.reload()
    await expect(mech.getByRole('region', { name: 'Payment' }).getByTestId('pay-qr')).toBeVisible({ timeout: 30_000 })
    await expect(mech.getByRole('region', { name: 'Payment' }).getByText('(no signal now)')).toBeVisible()
    await phone.close()

    // The driver opens the link on their own phone, with no account.
    const payer = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
    const p = await payer.newPage()
    await p.goto(link)
    await expect(p.getByRole('heading', { level: 1 })).toContainText('Invoice W-')
    await p.screenshot({ path: 'tests/e2e/screenshots/pay-page-360.png', fullPage: true })
    await p.getByRole('button', { name: /^Pay .* by card$/ }).click()
    await expect(p).toHaveURL(/127\.0\.0\.1:\d+\/checkout\/cs_test_/)
    await p.screenshot({ path: 'tests/e2e/screenshots/pay-hosted-page-360.png', fullPage: true })
    await p.getByRole('button', { name: /^Pay / }).click()
    await expect(p).toHaveURL(/\/pay\/[\w-]+\?done=1$/)
    await expect(p.getByRole('status')).toContainText('Paid. Thank you.', { timeout: 30_000 })
    await p.screenshot({ path: 'tests/e2e/screenshots/pay-page-paid-360.png', fullPage: true })
    await payer.close()

    const office = await browser.newPage()
    await signIn(office, 'office@wayside.test')
    await office.goto(`/billing/invoices/${invoiceId}`)
    await expect(office.getByRole('region', { name: 'Money on this invoice' }).getByText('Paid', { exact: true })).toBeVisible()
    await expect(office.getByText(/card \(payment page\) on/)).toBeVisible()
    await office.screenshot({ path: 'tests/e2e/screenshots/billing-invoice-paid-by-card-1280.png', fullPage: true })
  })
