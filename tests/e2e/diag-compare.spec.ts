// Like sensors on a 360 px phone: refused while the engine runs, compared key on, engine off after
// a cold soak (with the air), the chart's names written in full, saved as readings; and the
// manifold pressure against the barometric one.
import { expect, test, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'
import { PHONE, signIn } from './helpers'

const CALL_5 = seedId('call:c5') // at the truck, assigned to mech2 (server/db/seed/core.ts)
const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })

// Records what the chart writes on its canvas, so the test can tell a whole name from a cut one.
const recordCanvasText = () => {
  const w = window as unknown as { canvasTexts: { text: string, x: number }[] }
  w.canvasTexts = []
  const fill = CanvasRenderingContext2D.prototype.fillText
  CanvasRenderingContext2D.prototype.fillText = function (text: string, x: number, y: number, maxWidth?: number) {
    w.canvasTexts.push({ text, x })
    return fill.call(this, text, x, y, maxWidth)
  }
}

test('like sensors at 360 px: refused running, compared after a cold soak with the air, names in full, saved', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  await ctx.addInitScript(recordCanvasText)
  const page = await ctx.newPage()
  await signIn(page, 'mech2@wayside.test')
  await expect(page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: /#5/ })).toBeVisible()
  await page.goto(`/m/calls/${CALL_5}/compare`)
  await expect(page.getByRole('heading', { level: 1, name: 'Compare like sensors' })).toBeVisible()
  const fit = page.getByTestId('compare-fit')
  await expect(fit).toHaveAttribute('data-verdict', 'refuse')
  await expect(fit).toContainText('Say the conditions')

  // Running: exhaust temperatures along the after-treatment differ by design.
  await page.getByRole('radio', { name: 'Engine running' }).click()
  await page.getByLabel('Engine off for (hours)').fill('10')
  await page.getByLabel('Air here (°C)').fill('12')
  await expect(fit).toContainText('differ by design')
  await shot(page, 'diag-compare-refused-running-360')

  // Key on, engine off after 10 h: the open coolant sensor reads -40 °C.
  await page.getByRole('radio', { name: 'Key on, engine off' }).click()
  await expect(fit).toHaveCount(0)
  for (const [label, v] of [['Coolant', '-40'], ['Oil', '11'], ['Fuel', '13'], ['Intake manifold air', '9']] as const) {
    await page.getByLabel(`${label} (°C)`).fill(v)
  }
  // median 10 °C, MAD 2 °C: the modified z-score cut-off (Iglewicz and Hoaglin) flags only the coolant, 50 °C below
  await expect(page.getByRole('heading', { name: /Coolant disagrees: 50 °C below the median/ })).toBeVisible()
  await expect(page.getByTestId('compare-air')).toContainText('as it should be after a soak')
  await expect(page.getByRole('list', { name: 'Each sensor' })).toContainText('bottom of a one-byte J1939 temperature')

  // A short soak is compared, with a warning.
  await page.getByLabel('Engine off for (hours)').fill('3')
  await expect(fit).toHaveAttribute('data-verdict', 'warn')
  await expect(fit).toContainText('under 8 h')
  await page.getByLabel('Engine off for (hours)').fill('10')

  // Exhaust temperatures after the soak: the long names are written whole above their bars.
  await page.getByRole('button', { name: 'Exhaust temperatures' }).click()
  for (const [n, v] of [['1', '14'], ['2', '15'], ['3', '55'], ['4', '13']] as const) {
    await page.getByLabel(`Exhaust temperature ${n} (°C)`).fill(v)
  }
  await expect(page.getByRole('heading', { name: /Exhaust temperature 3 disagrees: 40.5 °C above the median/ })).toBeVisible()
  await expect.poll(() => page.evaluate(() => (window as unknown as { canvasTexts: { text: string }[] }).canvasTexts.map(t => t.text)))
    .toEqual(expect.arrayContaining([expect.stringMatching(/^Exhaust temperature 1 {2}−0\.5 °C$/)]))
  const texts = await page.evaluate(() => (window as unknown as { canvasTexts: { text: string, x: number }[] }).canvasTexts)
  const names = texts.filter(t => t.text.startsWith('Exhaust temperature'))
  expect(names.every(t => t.x >= 0 && !t.text.includes('…'))).toBe(true)
  expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width)
  await shot(page, 'diag-compare-exhaust-360')

  await page.getByRole('button', { name: 'Save 4 readings and the air to the call' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Saved as 5 readings' })).toBeVisible()

  // The manifold pressure against the barometric one, key on, engine off.
  await page.getByRole('radio', { name: 'Manifold and barometric' }).click()
  await page.getByRole('radio', { name: 'Key on, engine off' }).click()
  await page.getByLabel('Manifold pressure (kPa)').fill('121')
  await page.getByLabel('Barometric pressure (kPa)').fill('101')
  await expect(page.getByTestId('pressure-verdict')).toContainText('The manifold sensor disagrees: 20 kPa above barometric')
  await page.getByRole('radio', { name: 'Boost (gauge)' }).click()
  await page.getByLabel('Manifold pressure (kPa)').fill('0.5')
  await expect(page.getByTestId('pressure-verdict')).toContainText('They agree')
  await page.getByLabel('Barometric pressure (kPa)').fill('14.7')
  await expect(page.getByText('is no road\'s air')).toBeVisible()
  await page.getByRole('radio', { name: 'Engine running' }).click()
  await expect(page.getByTestId('compare-fit')).toContainText('turbocharger')
  await shot(page, 'diag-compare-pressure-360')

  // What was saved: readings with their conditions, judged against the median.
  await page.goto(`/m/calls/${CALL_5}`)
  const list = page.getByRole('list', { name: 'Readings recorded' })
  await expect(list).toContainText('Exhaust temperature 3')
  await expect(list).toContainText('key on, engine off')
  // Synced: the five readings reach the server with their conditions as stored words.
  const saved = () => testPool().query(`SELECT count(*)::int AS n FROM readings WHERE call_id = $1 AND conditions = 'key_on_engine_off'
    AND (label LIKE 'Exhaust temperature %' OR label = 'Air temperature')`, [CALL_5])
  await expect.poll(async () => (await saved()).rows[0].n, { timeout: 30_000 }).toBe(5)
  await ctx.close()
})
