// The phone's shell: a cold start with no signal (the browser closed and started again) after one
// visit with signal shows the mechanic's calls from the phone; and what the phone paints first,
// before any script of the app runs, is the bar and a line saying the calls are coming, never a
// blank screen. Behaviour only; the timings are the benchmark's (npm run bench -- field-cold-start).
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, expect, test, type BrowserContext } from '@playwright/test'
import { PASSWORD, PHONE } from './helpers'

const BASE = process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3100'
const ARGS = ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking']
const profile = mkdtempSync(join(tmpdir(), 'wayside-shell-'))

/** A browser started afresh on the same profile: what survives is what the phone keeps (worker, IndexedDB, cookies). */
function startBrowser(): Promise<BrowserContext> {
  return chromium.launchPersistentContext(profile, {
    executablePath: process.env.WAYSIDE_CHROMIUM ?? '/usr/bin/chromium', args: ARGS, baseURL: BASE,
    viewport: PHONE, isMobile: true, hasTouch: true,
  })
}

const openCalls = (ctx: BrowserContext) => ctx.pages()[0]!.getByRole('list', { name: 'Open calls' }).getByRole('link')

test.afterAll(() => rmSync(profile, { recursive: true, force: true }))

test('a cold start with no signal paints the bar first, then the calls kept on the phone', async () => {
  test.slow()
  // One visit with signal: sign in, the worker takes the page, the first sync fills the phone.
  let ctx = await startBrowser()
  let page = ctx.pages()[0] ?? await ctx.newPage()
  await page.goto('/login')
  await page.getByLabel('E-mail').fill('mech1@wayside.test')
  await page.getByLabel('Password').fill(PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForFunction(() => !!navigator.serviceWorker?.controller, undefined, { timeout: 30_000 })
  await expect(openCalls(ctx).first()).toBeVisible({ timeout: 30_000 })
  const numbers = await openCalls(ctx).allTextContents()
  expect(numbers.length).toBeGreaterThan(0)
  await ctx.close()

  // Started again with no signal, the app's scripts held back: what paints is the shell's own markup.
  ctx = await startBrowser()
  await ctx.setOffline(true)
  page = ctx.pages()[0] ?? await ctx.newPage()
  const cdp = await ctx.newCDPSession(page)
  await cdp.send('Emulation.setScriptExecutionDisabled', { value: true })
  await page.goto('/m')
  await expect(page.getByTestId('shell-opening')).toContainText('Opening Wayside')
  await expect(page.getByText('Wayside', { exact: true })).toBeVisible()
  await expect(page.getByRole('list', { name: 'Open calls' })).toHaveCount(0)
  await page.screenshot({ path: 'tests/e2e/screenshots/field-shell-first-paint-360.png' })

  // Scripts on: the same cold start shows the calls from the phone, with no signal.
  await cdp.send('Emulation.setScriptExecutionDisabled', { value: false })
  await page.goto('/m')
  await expect(page.getByRole('heading', { level: 1, name: 'My calls' })).toBeVisible()
  await expect(page.getByTestId('no-signal')).toBeVisible()
  await expect(openCalls(ctx).first()).toBeVisible()
  expect(await openCalls(ctx).allTextContents()).toEqual(numbers)
  await expect(page.getByTestId('shell-opening')).toHaveCount(0)
  await page.screenshot({ path: 'tests/e2e/screenshots/field-shell-offline-calls-360.png' })

  // A call opens from there, still with no signal.
  await openCalls(ctx).first().click()
  await expect(page.getByRole('heading', { level: 1, name: /^Call #\d+/ })).toBeVisible()
  await ctx.close()
})
