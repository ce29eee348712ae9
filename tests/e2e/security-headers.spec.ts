// The content security policy in a real browser: the dispatch board, the reports, the mechanic's
// phone online and offline (the service worker and the prerendered shell) and the like-sensor
// chart (a canvas) all work, and the browser reports no policy violation on any of them.
import { expect, test, type BrowserContext, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

const CALL_5 = seedId('call:c5') // assigned to mech2 (server/db/seed/core.ts)
const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })

/** Every violation the browser reports, from the page's event and from the console. */
async function watchViolations(ctx: BrowserContext) {
  const seen: string[] = []
  await ctx.addInitScript(() => {
    document.addEventListener('securitypolicyviolation', (e) => {
      console.error(`[csp] ${e.violatedDirective} blocked ${e.blockedURI || 'inline'} (${e.sourceFile}:${e.lineNumber})`)
    })
  })
  ctx.on('console', (msg) => {
    const text = msg.text()
    if (/\[csp\]|Content Security Policy|Refused to (execute|load|apply|connect)/i.test(text)) seen.push(text)
  })
  ctx.on('weberror', err => seen.push(`page error: ${err.error().message}`))
  return seen
}

test('the office screens run under the policy: dispatch board and reports', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } })
  const violations = await watchViolations(ctx)
  const page = await ctx.newPage()
  const answer = await page.goto('/login')
  expect(answer?.headers()['content-security-policy']).toMatch(/'nonce-/)
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/dispatch')
  await expect(page.getByRole('heading', { level: 1 })).toBeVisible()
  await expect(page.locator('table, [data-view]').first()).toBeVisible()
  await shot(page, 'security-dispatch-board')
  await page.goto('/reports')
  await expect(page.getByRole('heading', { name: 'Reports' })).toBeVisible()
  await expect(page.locator('table').first()).toBeVisible()
  await shot(page, 'security-reports')
  expect(violations).toEqual([])
  await ctx.close()
})

test('the phone runs under the policy: service worker, offline shell, and the like-sensor chart', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const violations = await watchViolations(ctx)
  const page = await ctx.newPage()
  await signIn(page, 'mech2@wayside.test')
  await waitForServiceWorker(page)
  await expect(page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: /#5/ })).toBeVisible()

  await page.goto(`/m/calls/${CALL_5}/compare`)
  await page.getByRole('radio', { name: 'Key on, engine off' }).click()
  await page.getByLabel('Engine off for (hours)').fill('10')
  await page.getByLabel('Air here (°C)').fill('12')
  for (const [label, v] of [['Coolant', '9'], ['Oil', '12'], ['Intake manifold air', '15'], ['Fuel', '-40']] as const) {
    await page.getByLabel(`${label} (°C)`).fill(v)
  }
  const canvas = page.locator('canvas')
  await expect(canvas).toBeVisible()
  // Drawn, not just placed: some pixel is not blank.
  await expect.poll(() => canvas.evaluate((c: HTMLCanvasElement) => {
    const data = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data
    return data.some(v => v !== 0)
  })).toBe(true)
  await shot(page, 'security-compare-chart-360')

  await ctx.setOffline(true)
  await page.goto('/m')
  await expect(page.getByText('No signal').first()).toBeVisible()
  await expect(page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: /#5/ })).toBeVisible()
  await shot(page, 'security-offline-shell-360')
  expect(violations).toEqual([])
  await ctx.close()
})

test('an error page shows the reference a person can quote', async ({ page }) => {
  await signIn(page, 'office@wayside.test')
  const answer = await page.goto('/no-such-page-at-all')
  expect(answer?.status()).toBe(404)
  const id = answer!.headers()['x-request-id']!
  await expect(page.getByTestId('request-id')).toHaveText(id)
  await shot(page, 'security-error-page')
})

test('a weak new password is refused with the reason beside the box', async ({ page }) => {
  await page.setViewportSize({ width: 1280, height: 800 })
  await signIn(page, 'admin@wayside.test')
  await page.goto('/setup/people')
  await expect(page.getByRole('heading', { name: 'People and roles' })).toBeVisible()
  await page.getByLabel('Name', { exact: true }).fill('Dana Okafor')
  await page.getByLabel('E-mail').fill(`dana-${Date.now()}@wayside.test`)
  await page.getByLabel('First password').fill('wayside-demo')
  await page.getByRole('button', { name: 'Add person' }).click()
  const box = page.getByLabel('First password')
  await expect(box).toHaveAttribute('aria-invalid', 'true')
  await expect(box.locator('xpath=following-sibling::p[1]')).toHaveText(/Too easy to guess: .*tied to Wayside/)
  await shot(page, 'security-weak-password')
  await box.fill('copper lantern meadow')
  await page.getByRole('button', { name: 'Add person' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Dana Okafor can now sign in.' })).toBeVisible()
})
