import { expect, test } from '@playwright/test'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

test.describe('each role lands on its own home', () => {
  for (const [email, path, heading] of [
    ['admin@wayside.test', '/setup', 'Setup'],
    ['dispatch@wayside.test', '/dispatch', 'Dispatch'],
    ['office@wayside.test', '/billing', 'Billing'],
    ['mech1@wayside.test', '/m', 'My calls'],
  ] as const) {
    test(`${email} → ${path}`, async ({ page }) => {
      await signIn(page, email)
      await expect(page).toHaveURL(new RegExp(`${path}$`))
      await expect(page.getByRole('heading', { level: 1, name: heading })).toBeVisible()
    })
  }

  test('a page of another role sends the person to their own home', async ({ page }) => {
    await signIn(page, 'mech1@wayside.test')
    await page.goto('/setup/people')
    await expect(page).toHaveURL(/\/m$/)
  })

  test('signed out, a page asks for sign-in first', async ({ page }) => {
    await page.goto('/dispatch')
    await expect(page).toHaveURL(/\/login\?next=/)
  })
})

test('screenshots of the mechanic home (phone) and the dispatch home (desktop)', async ({ browser }) => {
  const phone = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const p = await phone.newPage()
  await signIn(p, 'mech1@wayside.test')
  await expect(p.getByRole('heading', { name: 'My calls' })).toBeVisible()
  await p.screenshot({ path: 'tests/e2e/screenshots/mechanic-home-360.png', fullPage: true })
  // Every tappable thing on the phone home is at least 48 px tall (gloved hands).
  const small = await p.locator('main a, main button, nav a')
    .evaluateAll(els => els.filter(e => e.getBoundingClientRect().height < 47.5).map(e => e.textContent))
  expect(small).toEqual([])
  await phone.close()

  const desk = await browser.newContext({ viewport: { width: 1280, height: 800 } })
  const d = await desk.newPage()
  await signIn(d, 'dispatch@wayside.test')
  await expect(d.getByRole('heading', { name: 'Dispatch' })).toBeVisible()
  await d.screenshot({ path: 'tests/e2e/screenshots/dispatch-home-1280.png', fullPage: true })
  await desk.close()
})

test('the night theme is kept across a reload', async ({ page }) => {
  await signIn(page, 'office@wayside.test')
  await page.getByRole('button', { name: 'Night' }).click()
  await expect(page.locator('html')).toHaveClass(/theme-night/)
  await page.reload()
  await expect(page.locator('html')).toHaveClass(/theme-night/)
})

test('after one online visit, an offline reload of a mechanic page still opens the shell', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signIn(page, 'mech1@wayside.test')
  await waitForServiceWorker(page)
  await ctx.setOffline(true)
  await page.reload()
  await expect(page.getByRole('navigation', { name: 'Main' }).getByText('My calls')).toBeVisible()
  await expect(page.getByText('No signal').first()).toBeVisible()
  await page.goto('/m/settings')
  await expect(page.getByRole('heading', { name: 'Settings' })).toBeVisible()
  await ctx.close()
})
