import { expect, test } from '@playwright/test'
import { PHONE, signIn } from './helpers'

const DESK = { width: 1280, height: 800 }

test('the dispatch board is usable on a 360 px screen: cards, no sideways scrolling, urgent calls first', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE })
  const page = await ctx.newPage()
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/dispatch')
  const list = page.getByRole('list', { name: 'Open calls' })
  await expect(list).toBeVisible()
  await expect(page.locator('table.data-table')).toBeHidden()
  // Nothing wider than the screen: the page never scrolls sideways.
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth)
  expect(overflow).toBeLessThanOrEqual(0)
  // The seeded countdown call (#3, DEF countdown) is above every call whose engine still runs.
  const cards = list.getByRole('listitem')
  await expect(cards.first()).toContainText(/Countdown|Shut down/)
  // Each card leads to its call and says its status in words.
  await expect(cards.first().getByRole('link')).toHaveAttribute('href', /\/calls\//)
  await expect(list.getByText('Waiting for a mechanic').first()).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/desk-board-360.png', fullPage: true })
  await ctx.close()
})

test('the admin\'s top bar stays on one line at 1280 px, and the rates screen refuses a tax over 30 %', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: DESK })
  const page = await ctx.newPage()
  await signIn(page, 'admin@wayside.test')
  await page.goto('/setup/rates')
  const bar = page.locator('header > div').first()
  const tops = await bar.evaluate(el => [...el.querySelectorAll('a, button')]
    .filter(x => (x as HTMLElement).offsetParent !== null).map(x => Math.round(x.getBoundingClientRect().top)))
  expect(tops.length).toBeGreaterThan(8)
  // One line: every link and button of the bar starts within a few pixels of the first.
  expect(Math.max(...tops) - Math.min(...tops)).toBeLessThanOrEqual(8)
  await page.screenshot({ path: 'tests/e2e/screenshots/desk-topbar-1280.png', clip: { x: 0, y: 0, width: 1280, height: 120 } })

  const tax = page.getByLabel('Tax rate (%)')
  await tax.fill('35')
  await page.getByRole('button', { name: /Save/ }).click()
  await expect(page.getByText('Tax rate cannot be above 30 %')).toBeVisible()
  await ctx.close()
})
