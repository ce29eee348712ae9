// The call's map link opens on both major phone platforms: a geo: URI on Android, the maps site
// (which iOS opens in its map app) on an iPhone, the web map elsewhere; the web map and the
// coordinates are always there as a fallback.
import { expect, test } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { PHONE, signIn } from './helpers'

const CALL_5 = seedId('call:c5') // 45.335, -93.351 (server/db/seed/core.ts)
// User agents in the shapes Safari on iOS 17 and Chrome on Android 14 send (from memory).
const AGENTS = {
  ios: 'Mozilla/5.0 (iPhone; CPU iPhone OS 17_4 like Mac OS X) AppleWebKit/605.1.15 (KHTML, like Gecko) '
    + 'Version/17.4 Mobile/15E148 Safari/604.1',
  android: 'Mozilla/5.0 (Linux; Android 14; K) AppleWebKit/537.36 (KHTML, like Gecko) Chrome/124.0.0.0 Mobile Safari/537.36',
} as const
const WEB = 'https://www.openstreetmap.org/?mlat=45.335000&mlon=-93.351000#map=17/45.335000/-93.351000'

for (const [platform, href] of [
  ['ios', 'https://maps.apple.com/?ll=45.335000,-93.351000&q=Call%20%235'],
  ['android', 'geo:45.335000,-93.351000?q=45.335000,-93.351000(Call%20%235)'],
] as const) {
  test(`the map link on ${platform}`, async ({ browser }) => {
    const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true, userAgent: AGENTS[platform] })
    const page = await ctx.newPage()
    await signIn(page, 'mech2@wayside.test')
    await expect(page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: /#5/ })).toBeVisible()
    await page.goto(`/m/calls/${CALL_5}`)
    const link = page.getByTestId('map-app-link')
    await expect(link).toHaveAttribute('data-platform', platform)
    await expect(link).toHaveAttribute('href', href)
    await expect(page.getByRole('link', { name: 'Web map' })).toHaveAttribute('href', WEB)
    await expect(page.getByRole('button', { name: 'Copy the position 45.335000, -93.351000' })).toBeVisible()
    const header = page.locator('section[aria-labelledby="call-title"]')
    await header.screenshot({ path: `tests/e2e/screenshots/field-map-link-${platform}-360.png` })
    await ctx.close()
  })
}
