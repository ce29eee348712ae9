import { execFileSync } from 'node:child_process'
import { mkdirSync, writeFileSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

const SHOTS = 'tests/e2e/screenshots'

test.setTimeout(600_000)

test('the office adjusts a draft with a reason, sends it to the address it confirms, and posts it to the account', async ({ page }) => {
  mkdirSync(SHOTS, { recursive: true })
  mkdirSync('test-results', { recursive: true })
  await signIn(page, 'office@wayside.test')
  const desk = page.getByRole('table', { name: /waiting to be billed/ })
  const row = desk.getByRole('row').filter({ hasText: 'Ironwood Freight Lines' }).filter({ has: page.getByRole('button',
    { name: 'Draft invoice' }) }).first()
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
  // The request only queues the e-mail; the job renders the PDF and hands it to the mail server.
  await expect(page.getByText('On its way to payables@ironwood-freight.test')).toBeVisible()
  await expect(page.getByRole('button', { name: /^Change / })).toHaveCount(0)
  // Rendering the PDF and handing it to the mail server can take a while on a busy machine.
  await expect(page.getByRole('region', { name: 'E-mail' }).getByText('Sent', { exact: true })).toBeVisible({ timeout: 180_000 })

  // The first page of the PDF the fleet receives, rendered for people to look at.
  const pdf = await page.request.get(`${page.url().replace(/\/billing\/invoices\//, '/api/invoices/')}/pdf`)
  expect(pdf.headers()['content-type']).toBe('application/pdf')
  writeFileSync('test-results/invoice.pdf', await pdf.body())
  execFileSync('pdftoppm', ['-png', '-r', '80', '-f', '1', '-l', '1', '-singlefile', 'test-results/invoice.pdf',
    `${SHOTS}/invoice-pdf-page1`])

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

test('the office records a check for part, issues a credit note, gives money back, and the PDF lists each', async ({ page }) => {
  mkdirSync(SHOTS, { recursive: true })
  mkdirSync('test-results', { recursive: true })
  await signIn(page, 'office@wayside.test')
  const desk = page.getByRole('table', { name: /waiting to be billed/ })
  await desk.getByRole('row').filter({ hasText: 'Prairie Cold Haul' }).getByRole('button', { name: 'Draft invoice' }).first().click()
  await expect(page).toHaveURL(/\/billing\/invoices\//)
  await page.getByRole('button', { name: 'Send by e-mail' }).click()
  await page.getByRole('dialog').getByRole('button', { name: 'Send to ap@prairiecold.test' }).click()
  await expect(page.getByText('On its way to ap@prairiecold.test')).toBeVisible()
  const money = page.getByRole('region', { name: 'Money on this invoice' })
  const dueText = async () => (await money.locator('dd').last().textContent())!.trim()
  const cents = (s: string) => Math.round(Number(s.replace(/[^\d.-]/g, '')) * 100)
  const total = cents(await dueText())

  // A check for part of it: the reference is asked for, then the rest shows as still due.
  await page.getByLabel('Amount', { exact: true }).fill('100.00')
  await page.getByRole('button', { name: 'Record payment' }).click()
  await expect(page.getByText('Enter the check number')).toBeVisible()
  await page.getByLabel('Check number').fill('CK 5521')
  await page.getByRole('button', { name: 'Record payment' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Check recorded.' })).toBeVisible()
  await expect(money.getByText('Partly paid')).toBeVisible()
  expect(cents(await dueText())).toBe(total - 10000)

  // A credit note takes $10.00 of travel off.
  await page.getByRole('button', { name: 'Issue a credit note…' }).click()
  await page.getByLabel('What it corrects').fill('Travel billed twice')
  await page.getByLabel('Line 1 description').fill('Travel, second leg')
  await page.getByLabel('Line 1 amount').fill('10.00')
  await page.getByRole('button', { name: 'Issue credit note' }).click()
  await expect(page.getByText(/Credit note CN-\d+/)).toBeVisible()
  expect(cents(await dueText())).toBe(total - 10000 - 1000)

  // $5.00 of the check given back at the counter.
  await page.getByRole('button', { name: 'Refund…' }).click()
  await page.getByLabel('Amount to refund').fill('5.00')
  await page.getByLabel('Why').fill('Cash back at the counter')
  await page.getByRole('button', { name: 'Refund', exact: true }).click()
  await expect(page.getByText(/Refunded \$5\.00 on .*: Cash back at the counter/)).toBeVisible()
  expect(cents(await dueText())).toBe(total - 10000 - 1000 + 500)
  await page.screenshot({ path: `${SHOTS}/billing-invoice-payments-1280.png`, fullPage: true })

  // The PDF the fleet gets lists the check, the credit note and the refund under the totals.
  const pdf = await page.request.get(`${page.url().replace(/\/billing\/invoices\//, '/api/invoices/')}/pdf`)
  writeFileSync('test-results/invoice-payments.pdf', await pdf.body())
  execFileSync('pdftoppm', ['-png', '-r', '80', '-singlefile', '-f', '1', '-l', '1', 'test-results/invoice-payments.pdf',
    `${SHOTS}/invoice-pdf-payments-page1`])
  const text = execFileSync('pdftotext', ['-layout', 'test-results/invoice-payments.pdf', '-']).toString()
  expect(text).toContain('Payments and credits')
  expect(text).toMatch(/Paid by check CK 5521/)
  expect(text).toMatch(/Refunded, .*Cash back at the counter/)
  // The refund comes after the check it gives back part of.
  expect(text.indexOf('Paid by check CK 5521')).toBeLessThan(text.indexOf('Refunded, '))
  expect(text).toMatch(/Balance due/)
})
