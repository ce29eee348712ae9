// Diagnostics on the phone: the exhaust-temperature card run with no signal to a
// 'Replace sensor' conclusion, whose run and readings reach the server after sync.
// (The like-sensor screen has its own spec, diag-compare.spec.ts.)
import { expect, test, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

const CALL_5 = seedId('call:c5') // at the truck, SPN 3242 FMI 4, assigned to mech2 (server/db/seed/core.ts)
const EGT_CARD = seedId('card:egt-rtd-sensor')
const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })

test('the exhaust-temperature card runs offline to "Replace sensor", then syncs to the server', async ({ browser }) => {
  test.setTimeout(150_000)
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signIn(page, 'mech2@wayside.test')
  await waitForServiceWorker(page)
  // Online once: the call, then the card picker and the runner, so both are kept on the phone.
  await expect(page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: /#5/ })).toBeVisible()
  await page.goto(`/m/calls/${CALL_5}`)
  await expect(page.getByRole('heading', { level: 1, name: 'Call #5' })).toBeVisible()
  await expect(page.getByRole('link', { name: 'Run a test card (1 fits the codes)' })).toBeVisible()
  await page.locator('section[aria-labelledby="diag-tools-title"]').screenshot({ path: 'tests/e2e/screenshots/diag-call-tools-360.png' })
  await page.getByRole('link', { name: /Run a test card/ }).click()
  const suggestion = page.getByRole('region', { name: 'Fits this call\'s codes' }).getByRole('link', { name: /Exhaust temperature sensor/ })
  await expect(suggestion).toContainText('For SPN 3242 FMI 4')
  await suggestion.click()
  await expect(page).toHaveURL(new RegExp(`/test/${EGT_CARD}$`))
  await expect(page.getByRole('heading', { name: 'Before you start' })).toBeVisible()

  // No signal from here on, and the app opened again.
  await ctx.setOffline(true)
  await page.reload()
  await expect(page.getByRole('heading', { level: 1, name: /Exhaust temperature sensor/ })).toBeVisible()
  await expect(page.getByText('No signal').first()).toBeVisible()
  await expect(page.getByText(/exhaust pipes, the DPF/i)).toBeVisible()
  // The scene comes first: the checklist is at hand before the card's own cautions.
  await page.getByText(/Scene checklist: \d of 7 done/).click()
  await expect(page.getByTestId('warning-devices')).toContainText('3 m (10 ft)')
  await page.getByLabel(/Hazard flashers on/).check()
  await page.getByLabel(/Warning triangles placed/).check()
  await expect(page.getByRole('status').filter({ hasText: 'Saved: 2 of 7 done' })).toBeVisible()
  await shot(page, 'diag-runner-cautions-360')

  const ambient = page.getByLabel('Air temperature here')
  await expect(ambient).toHaveAttribute('inputmode', 'decimal')
  await ambient.fill('12')
  await page.getByRole('button', { name: 'I have read the cautions: start' }).click()
  // IEC 60751 scaled to R0 = 200 Ω: 209.36 Ω at 12 °C.
  await expect(page.getByTestId('step-spec')).toHaveText('A Pt200 at 12 °C should read 209.4 Ω ± 2 %')
  await expect(page.getByText('Key off', { exact: true })).toBeVisible()
  await shot(page, 'diag-runner-step-360')

  await page.getByLabel('Sensor resistance at ambient: reading').fill('118')
  await page.getByRole('button', { name: 'Record reading' }).click()
  await expect(page.getByTestId('verdict-why')).toHaveText('measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω ± 2 %; low')
  await shot(page, 'diag-runner-verdict-360')
  await page.getByRole('button', { name: 'Next: New sensor beside the old one' }).click()
  await expect(page.getByText('Installed part read 118 Ω')).toBeVisible()
  await page.getByLabel('New sensor beside the old one: reading').fill('210,2')
  await page.getByRole('button', { name: 'Record reading' }).click()
  await expect(page.getByLabel('Installed and new part side by side')).toContainText('210.2 Ω')
  await shot(page, 'diag-runner-compare-360')
  await page.getByRole('button', { name: 'Conclusion: Replace sensor' }).click()
  await expect(page.getByRole('heading', { level: 2, name: 'Replace sensor' })).toBeVisible()
  await page.getByRole('button', { name: 'Save to the call' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Saved to this call' })).toBeVisible()
  await shot(page, 'diag-runner-conclusion-360')

  // Still offline: the readings are on the call, waiting to sync.
  await page.getByRole('link', { name: 'Back to the call' }).first().click()
  await expect(page.getByRole('list', { name: 'Readings recorded' })).toContainText('Sensor resistance at ambient')
  expect((await testPool().query('SELECT count(*)::int AS n FROM test_runs WHERE call_id = $1', [CALL_5])).rows[0].n).toBe(0)

  // Back in signal: the sync engine sends the run, then its readings.
  await ctx.setOffline(false)
  await expect.poll(async () => (await testPool().query('SELECT count(*)::int AS n FROM test_runs WHERE call_id = $1', [CALL_5])).rows[0].n, { timeout: 30_000 }).toBe(1)
  const run = (await testPool().query('SELECT id, card_id, card_version, ambient_c, conclusion, jsonb_array_length(steps) AS steps FROM test_runs WHERE call_id = $1', [CALL_5])).rows[0]
  expect(run).toMatchObject({ card_id: EGT_CARD, card_version: 1, ambient_c: 12, conclusion: 'Replace sensor', steps: 2 })
  await expect.poll(async () => (await testPool().query('SELECT count(*)::int AS n FROM readings WHERE test_run_id = $1', [run.id])).rows[0].n, { timeout: 30_000 }).toBe(2)
  const readings = (await testPool().query('SELECT label, value, unit, part_role, verdict, conditions FROM readings WHERE test_run_id = $1 ORDER BY part_role', [run.id])).rows
  expect(readings).toEqual([
    { label: 'Sensor resistance at ambient', value: 118, unit: 'ohm', part_role: 'installed', verdict: 'low', conditions: 'key_off' },
    { label: 'New sensor beside the old one', value: 210.2, unit: 'ohm', part_role: 'new', verdict: 'pass', conditions: 'key_off' },
  ])
  // The saved run on the phone, as the office's run summary shows it.
  await page.goto(`/m/calls/${CALL_5}/test`)
  const saved = page.getByRole('region', { name: 'Saved on this call' })
  await expect(saved).toContainText('Replace sensor')
  await expect(saved).toContainText('measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω ± 2 %; low')
  await shot(page, 'diag-run-summary-360')
  await ctx.close()
})

test('fault codes at the card picker: decoded as typed, cleared, and flagged as returned when read again', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signIn(page, 'mech2@wayside.test')
  await expect(page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: /#5/ })).toBeVisible()
  await page.goto(`/m/calls/${CALL_5}/test`)
  const seeded = page.getByRole('article', { name: 'Fault code SPN 3242 FMI 4' })
  // SAE J1939-73 FMI 4 (REFERENCES §4): voltage below normal or shorted low
  await expect(seeded).toContainText('FMI 4: Voltage below normal, or shorted to a low source')
  await seeded.getByRole('button', { name: 'Mark cleared after the repair' }).click()
  await expect(seeded).toContainText('Cleared')

  await page.getByText('Add a code read off the truck').click()
  await page.getByRole('radio', { name: 'P/C/B/U code' }).click()
  await page.getByLabel('Fault code', { exact: true }).fill('PO544')
  // J2012: the second character is a digit 0–3 (the letter O is a common slip)
  await expect(page.getByRole('alert').filter({ hasText: 'the letter O? type the digit 0' })).toBeVisible()
  await page.getByLabel('Fault code', { exact: true }).fill('p0544')
  await expect(page.getByTestId('fault-decoded')).toContainText('powertrain · SAE-defined')
  await page.getByRole('radio', { name: 'SPN / FMI' }).click()
  await page.getByLabel('SPN', { exact: true }).fill('3242')
  await page.getByLabel('FMI', { exact: true }).selectOption('4')
  await page.getByRole('button', { name: 'Add fault code' }).click()
  const again = page.getByRole('article', { name: 'Fault code SPN 3242 FMI 4' }).last()
  await expect(again).toContainText('Returned: cleared')
  await expect(page.getByRole('article', { name: 'Fault code SPN 3242 FMI 4' })).toHaveCount(2)
  await page.getByRole('region', { name: /Fault codes on this call/ }).screenshot({ path: 'tests/e2e/screenshots/diag-fault-codes-360.png' })
  await ctx.close()
})

test('the admin edits a card: mistakes are named beside the field, a good change makes version 2', async ({ page }) => {
  await page.setViewportSize({ width: 1280, height: 900 })
  await signIn(page, 'admin@wayside.test')
  await page.getByRole('link', { name: /Test cards/ }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'Test cards' })).toBeVisible()
  for (const title of ['Exhaust temperature sensor (platinum RTD) and circuit', 'Coolant temperature sensor (NTC thermistor)', 'Battery state of charge and charging voltage (12 V)', 'DEF concentration with a refractometer', '5 V sensor reference circuit']) {
    await expect(page.getByRole('link', { name: title, exact: true })).toBeVisible()
  }
  await page.getByLabel('Filter').fill('spn 3516')
  await expect(page.locator('tbody tr')).toHaveCount(1)
  await page.getByRole('link', { name: 'DEF concentration with a refractometer' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'DEF concentration with a refractometer' })).toBeVisible()
  // ISO 22241-1 window as seeded
  const step2 = page.getByRole('group', { name: 'Step 2' })
  await expect(step2.getByLabel('Min (%)')).toHaveValue('31.8')
  await expect(step2.getByLabel('Max (%)')).toHaveValue('33.2')

  // A new step left blank, and a blank title: the form names each problem where it is.
  await page.getByRole('group', { name: 'Step 1' }).getByLabel('Title').fill('')
  await page.getByRole('button', { name: 'Add a step' }).click()
  await page.getByRole('button', { name: 'Save as version 2' }).click()
  await expect(page.getByRole('group', { name: 'Step 1' }).getByText('Enter a short title')).toBeVisible()
  await expect(page.getByRole('group', { name: 'Step 3' }).getByText('Pick where this leads').first()).toBeVisible()
  await page.getByRole('button', { name: 'Remove step 3' }).click()
  await page.getByRole('group', { name: 'Step 1' }).getByLabel('Title').fill('Sample clear, clean and free of crystals')
  await page.getByRole('button', { name: 'Save as version 2' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Saved as version 2' })).toBeVisible()
  await expect(page.getByText('version 2 · in use')).toBeVisible()
  await page.getByText(/Versions \(2\)/).click()
  await shot(page, 'diag-setup-card-1280')
  const r = await testPool().query('SELECT current_version FROM test_cards WHERE slug = \'def-concentration\'')
  expect(r.rows[0].current_version).toBe(2)
})
