// Every page of every role, in the sunlight and the night theme, checked by axe-core (WCAG 2.x A and
// AA rules plus its best practices): a serious or critical finding fails the test. Each role signs in
// once and visits its pages; on each page the theme is switched with the app's own button where the
// page has one (else the class the app sets on <html>). The sunlight theme runs every rule; the night
// theme changes only colours, so it runs the colour rules. A page two roles share is checked once.
import AxeBuilder from '@axe-core/playwright'
import { expect, test, type BrowserContext, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

type Visit = {
  path: string
  /** What shows once the page has its data (the page's heading, by default any h1). */
  ready?: (page: Page) => Promise<void>
  /** Something to do before the check, to put errors or open parts on the screen. */
  act?: (page: Page) => Promise<void>
  name?: string
}
type Finding = { where: string, rule: string, impact: string, help: string, targets: string[] }

const CALL_4 = seedId('call:c4') // en route, mech1
const CALL_5 = seedId('call:c5') // at the truck with an exhaust-temperature code, mech2
const CALL_6 = seedId('call:c6') // completed and repaired
const CALL_7 = seedId('call:c7') // invoiced
const INVOICE_7 = seedId('invoice:c7')
const UNIT_2 = seedId('unit:2')
const CUSTOMER = seedId('customer:ironwood')
const CARD = seedId('card:coolant-temp-ntc')
const EGT_CARD = seedId('card:egt-rtd-sensor')

const heading = (name: string | RegExp) => async (page: Page) => {
  await expect(page.getByRole('heading', { level: 1, name })).toBeVisible()
}

/** Submits the first form of the page empty, so its errors show beside their inputs. */
const submitEmpty = (button: string | RegExp) => async (page: Page) => {
  await page.getByRole('button', { name: button }).first().click()
  await expect(page.locator('[aria-invalid="true"]').first()).toBeVisible()
}

const DISPATCH: Visit[] = [
  { path: '/dispatch' },
  { path: '/dispatch?view=lanes', name: 'dispatch-lanes' },
  { path: '/dispatch/new' },
  { path: '/dispatch/new', name: 'dispatch-new-errors', act: submitEmpty(/^Take call/) },
  { path: '/customers' },
  { path: `/customers/${CUSTOMER}` },
  { path: '/units' },
  { path: `/units/${UNIT_2}` },
  { path: `/calls/${CALL_4}` },
  { path: `/calls/${CALL_6}` },
  { path: '/calls' },
  { path: '/reports' },
]
const OFFICE: Visit[] = [
  { path: '/calls' },
  { path: `/calls/${CALL_6}` },
  { path: `/calls/${CALL_7}` },
  { path: '/billing' },
  { path: `/billing/invoices/${INVOICE_7}` },
  { path: '/setup/trucks/restock' },
]
const ADMIN: Visit[] = [
  { path: '/setup' },
  { path: '/setup/people' },
  { path: '/setup/rates' },
  { path: '/setup/cards' },
  { path: `/setup/cards/${CARD}` },
  { path: '/setup/trucks' },
  { path: '/no-such-page-at-all', ready: heading(/./) },
]
const MECHANIC: Visit[] = [
  { path: '/m' },
  { path: `/m/calls/${CALL_5}`, ready: heading('Call #5') },
  { path: `/m/calls/${CALL_5}/test`, ready: heading(/./) },
  { path: `/m/calls/${CALL_5}/test/${EGT_CARD}`, ready: heading(/Exhaust temperature sensor/) },
  { path: `/m/calls/${CALL_5}/compare`, ready: heading(/./) },
  { path: '/m/sync' },
  { path: '/m/settings' },
]

const UUID = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/g
const slug = (v: Visit) => v.name ?? (v.path.replace(UUID, m => m.slice(0, 4)).replace(/^\//, '').replace(/[^\w]+/g, '-') || 'home')

/** The rules a theme can change: colours and what is drawn over what. */
const COLOUR_RULES = ['color-contrast', 'link-in-text-block']

async function check(page: Page, where: string, findings: Finding[], coloursOnly = false) {
  const axe = new AxeBuilder({ page })
  const result = await (coloursOnly
    ? axe.withRules(COLOUR_RULES)
    : axe.withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa', 'best-practice'])).analyze()
  for (const v of result.violations) {
    if (v.impact !== 'serious' && v.impact !== 'critical') continue
    findings.push({ where, rule: v.id, impact: v.impact, help: v.help, targets: v.nodes.slice(0, 5).map(n => n.target.join(' ')) })
  }
  // Rules that ran: passed, or found something to look at (contrast over an image is 'incomplete').
  return result.passes.length + result.incomplete.length
}

/** Switches the theme with the app's own button where the page has one, else sets the class the app sets. */
async function setTheme(page: Page, theme: 'sunlight' | 'night') {
  const html = page.locator('html')
  if (await html.evaluate((el, t) => el.classList.contains(`theme-${t}`), theme)) return
  const button = page.getByRole('button', { name: theme === 'night' ? 'Night' : 'Sunlight', exact: true })
  if (await button.isVisible()) await button.click()
  else {
    await html.evaluate((el, t) => {
      el.classList.remove('theme-sunlight', 'theme-night')
      el.classList.add(`theme-${t}`)
    }, theme)
  }
  await expect(html).toHaveClass(new RegExp(`theme-${theme}`))
}

/** Each page once, checked in the sunlight theme and then in the night theme. */
async function visitAll(page: Page, role: string, visits: Visit[], findings: Finding[]) {
  for (const v of visits) {
    await page.goto(v.path)
    await (v.ready ?? heading(/./))(page)
    // Lists and charts fill in after the heading; give the page a moment to stop asking for data.
    await page.waitForLoadState('networkidle', { timeout: 1_000 }).catch(() => {})
    if (v.act) await v.act(page)
    for (const theme of ['sunlight', 'night'] as const) {
      await setTheme(page, theme)
      const where = `${role} ${v.path}${v.name ? ` (${v.name})` : ''} [${theme}]`
      const passed = await check(page, where, findings, theme === 'night')
      expect(passed, `${where}: axe ran its rules`).toBeGreaterThan(theme === 'night' ? 0 : 10)
      await page.screenshot({ path: `tests/e2e/screenshots/a11y-${role}-${slug(v)}-${theme}.png` })
    }
    await setTheme(page, 'sunlight')
  }
}

function report(findings: Finding[]) {
  return findings.map(f => `${f.where}: ${f.impact} ${f.rule} (${f.help}) at ${f.targets.join(' | ')}`).join('\n')
}

async function runRole(ctx: BrowserContext, role: string, email: string, visits: Visit[], firstSync = false) {
  const page = await ctx.newPage()
  await signIn(page, email)
  if (firstSync) {
    // The phone's pages read from the device: let the first sync bring the calls and cards.
    await waitForServiceWorker(page)
    await page.goto('/m/sync')
    await expect(page.getByTestId('last-sync')).not.toHaveText('never', { timeout: 30_000 })
  }
  const findings: Finding[] = []
  await visitAll(page, role, visits, findings)
  expect(findings, report(findings)).toEqual([])
}

test.describe('accessibility (axe, both themes)', () => {
  test.describe.configure({ timeout: 900_000 })

  test('signed out: the sign-in page, the fleet\'s status link and the payer\'s page', async ({ browser }) => {
    // The links are made by the office, then opened in a context with no session.
    const desk = await browser.newContext()
    const d = await desk.newPage()
    await signIn(d, 'office@wayside.test')
    const share = await d.request.post(`/api/calls/${CALL_6}/share`, { data: {}, headers: { 'X-Wayside': '1' } })
    expect(share.ok(), await share.text()).toBe(true)
    const { url: statusUrl } = await share.json() as { url: string }
    const pay = await d.request.get(`/api/invoices/${INVOICE_7}/pay-link`)
    expect(pay.ok(), await pay.text()).toBe(true)
    const { url: payUrl } = await pay.json() as { url: string }
    await desk.close()

    const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
    const page = await ctx.newPage()
    const visits: Visit[] = [
      { path: '/login', ready: heading('Wayside') },
      { path: '/login', name: 'login-errors', ready: heading('Wayside'), act: submitEmpty('Sign in') },
      { path: new URL(statusUrl).pathname, name: 'status-link', ready: async p => expect(p.getByTestId('fleet-status')).toBeVisible() },
      { path: new URL(payUrl).pathname, name: 'pay-link' },
    ]
    // axe itself is working: grey-on-white text and an unnamed box on the sign-in page are found.
    await page.goto('/login')
    await page.evaluate(() => document.querySelector('main')?.insertAdjacentHTML('beforeend',
      '<p style="color:#aaa;background:#fff">faint</p><input type="text">'))
    const canary: Finding[] = []
    await check(page, 'canary', canary)
    expect(canary.map(f => f.rule)).toEqual(expect.arrayContaining(['color-contrast', 'label']))
    const findings: Finding[] = []
    await visitAll(page, 'public', visits, findings)
    expect(findings, report(findings)).toEqual([])
    await ctx.close()
  })

  test('dispatcher', async ({ browser }) => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } })
    await runRole(ctx, 'dispatcher', 'dispatch@wayside.test', DISPATCH)
    await ctx.close()
  })

  test('office', async ({ browser }) => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } })
    await runRole(ctx, 'office', 'office@wayside.test', OFFICE)
    await ctx.close()
  })

  test('admin', async ({ browser }) => {
    const ctx = await browser.newContext({ viewport: { width: 1280, height: 800 } })
    await runRole(ctx, 'admin', 'admin@wayside.test', ADMIN)
    await ctx.close()
  })

  test('mechanic, on a 360 px phone', async ({ browser }) => {
    const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
    await runRole(ctx, 'mechanic', 'mech2@wayside.test', MECHANIC, true)
    await ctx.close()
  })
})
