// Diagnostics on the phone: after the first sync and with no signal, the exhaust-temperature card
// run to a 'Replace' conclusion with the sensor judged at the pipe's own temperature, its run and
// readings reaching the server after; a data-valid code suggesting the condition card; the
// like-sensor comparison; fault codes at the picker; the admin's card editor.
// (The like-sensor screen has its own spec, diag-compare.spec.ts.)
import { expect, test, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

const CALL_5 = seedId('call:c5') // at the truck, SPN 3242 FMI 4 (a circuit FMI), assigned to mech2 (server/db/seed/core.ts)
const EGT_CARD = seedId('card:egt-rtd-sensor')
const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })

/** Signs in on a phone and waits for the first sync to finish, without opening any other page. */
async function firstSync(page: Page, email: string) {
  await signIn(page, email)
  await waitForServiceWorker(page)
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sync' }).click()
  await expect(page.getByTestId('last-sync')).not.toHaveText('never', { timeout: 30_000 })
}

const answer = async (page: Page, step: string, yes: 'Yes' | 'No', next: RegExp) => {
  await expect(page.getByRole('heading', { level: 2, name: step })).toBeVisible()
  await page.getByRole('button', { name: yes, exact: true }).click()
  await page.getByRole('button', { name: next }).click()
}

test('after the first sync, offline: the exhaust-temperature card runs to its conclusion, '
  + 'the sensor judged at the pipe’s temperature', async ({ browser }) => {
  test.setTimeout(180_000)
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  // The first sync alone brings the card library: no card page is opened with signal.
  await firstSync(page, 'mech2@wayside.test')

  // No signal from here on: the browser itself is offline, and the card library is on the phone.
  await ctx.setOffline(true)
  await page.goto(`/m/calls/${CALL_5}`)
  await expect(page.getByRole('heading', { level: 1, name: 'Call #5' })).toBeVisible()
  await expect(page.getByRole('link', { name: 'Run a test card (1 fits the codes)' })).toBeVisible()
  await page.locator('section[aria-labelledby="diag-tools-title"]').screenshot({ path: 'tests/e2e/screenshots/diag-call-tools-360.png' })
  await page.getByRole('link', { name: /Run a test card/ }).click()
  const suggestion = page.getByRole('region', { name: 'Fits this call\'s codes' }).getByRole('link', { name: /Exhaust temperature sensor/ })
  await expect(suggestion).toContainText('For SPN 3242 FMI 4')
  await suggestion.click()
  await expect(page).toHaveURL(new RegExp(`/test/${EGT_CARD}$`))
  await expect(page.getByRole('heading', { level: 1, name: /Exhaust temperature sensor/ })).toBeVisible()
  await expect(page.getByText(/exhaust pipes, the DPF/i)).toBeVisible()
  // The scene comes first: the checklist is at hand before the card's own cautions.
  await page.getByText(/Scene checklist: \d of \d+ done/).click()
  await expect(page.getByTestId('warning-devices')).toContainText('3 m (10 ft)')
  await page.getByLabel(/Hazard flashers on/).check()
  await page.getByLabel(/Warning triangles placed/).check()
  await expect(page.getByRole('status').filter({ hasText: /Saved: 2 of \d+ done/ })).toBeVisible()
  await shot(page, 'diag-runner-cautions-360')
  await page.getByRole('button', { name: 'I have read the cautions: start' }).click()

  // A look first, then the unplug-and-jumper test with live data.
  await expect(page.getByRole('heading', { level: 2, name: 'Look at the wiring and connector first' })).toBeVisible()
  await shot(page, 'diag-runner-look-360')
  await page.getByRole('button', { name: 'Yes', exact: true }).click()
  await page.getByRole('button', { name: 'Next: Unplugged: live data goes to the open value' }).click()
  await answer(page, 'Unplugged: live data goes to the open value', 'Yes', /Next: Jumpered/)
  await answer(page, 'Jumpered: live data goes to the shorted value', 'Yes', /Next: Sensor resistance at the pipe’s temperature/)

  // The sensor: its spec waits for the pipe's own temperature, then reads from the IEC 60751 curve.
  await expect(page.getByTestId('step-spec')).toHaveText('Enter the part’s temperature to see what it should read')
  const partTemp = page.getByLabel('Temperature of the part itself', { exact: true })
  await expect(partTemp).toHaveAttribute('inputmode', 'decimal')
  await partTemp.fill('12')
  // IEC 60751 table ×2: a Pt200 at 12 °C reads 209.36 Ω; ± 10 °C is 2 and 22 °C: 201.6–217.1 Ω
  await expect(page.getByTestId('step-spec')).toHaveText('A Pt200 at 12 °C should read 209.4 Ω (201.6–217.1 Ω for ± 10 °C)')
  await expect(page.getByText('Key off', { exact: true })).toBeVisible()
  await shot(page, 'diag-runner-step-360')
  await page.getByLabel('Sensor resistance at the pipe’s temperature: reading', { exact: true }).fill('118')
  await page.getByRole('button', { name: 'Record reading' }).click()
  await expect(page.getByTestId('verdict-why'))
    .toHaveText('measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω (201.6–217.1 Ω for ± 10 °C); low')
  await shot(page, 'diag-runner-verdict-360')
  // A part that may still be warm is asked about before anything is replaced.
  await page.getByRole('button', { name: 'Next: Was the sensor at a steady temperature?' }).click()
  await shot(page, 'diag-runner-settled-360')
  await answer(page, 'Was the sensor at a steady temperature?', 'Yes', /Next: New sensor beside the old one/)
  await expect(page.getByText('Installed part read 118 Ω at 12 °C')).toBeVisible()
  await page.getByLabel('Temperature of the part itself', { exact: true }).fill('20')
  // IEC 60751 table ×2 at 20 °C: 215.58 Ω
  await page.getByLabel('New sensor beside the old one: reading', { exact: true }).fill('215,6')
  await page.getByRole('button', { name: 'Record reading' }).click()
  await expect(page.getByLabel('Installed and new part side by side')).toContainText('215.6 Ω')
  await shot(page, 'diag-runner-compare-360')
  await page.getByRole('button', { name: 'Conclusion: Replace the exhaust temperature sensor' }).click()
  await expect(page.getByRole('heading', { level: 2, name: 'Replace the exhaust temperature sensor' })).toBeVisible()
  await page.getByRole('button', { name: 'Save to the call' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Saved to this call' })).toBeVisible()
  await shot(page, 'diag-runner-conclusion-360')
  expect((await testPool().query('SELECT count(*)::int AS n FROM test_runs WHERE call_id = $1', [CALL_5])).rows[0].n).toBe(0)

  // Back in signal: the sync engine sends the run, then its readings with the part's temperature.
  await ctx.setOffline(false)
  const runs = () => testPool().query('SELECT count(*)::int AS n FROM test_runs WHERE call_id = $1', [CALL_5])
  await expect.poll(async () => (await runs()).rows[0].n, { timeout: 30_000 }).toBe(1)
  const run = (await testPool().query(
    'SELECT id, card_id, card_version, ambient_c, conclusion, jsonb_array_length(steps) AS steps FROM test_runs WHERE call_id = $1',
    [CALL_5],
  )).rows[0]
  expect(run).toMatchObject({
    card_id: EGT_CARD, card_version: 1, ambient_c: null, conclusion: 'Replace the exhaust temperature sensor', steps: 6,
  })
  const readingsOf = () => testPool().query('SELECT count(*)::int AS n FROM readings WHERE test_run_id = $1', [run.id])
  await expect.poll(async () => (await readingsOf()).rows[0].n, { timeout: 30_000 }).toBe(2)
  const readings = (await testPool().query(
    'SELECT label, value, unit, part_role, verdict, conditions, spec->>\'partTempC\' AS part_c '
    + 'FROM readings WHERE test_run_id = $1 ORDER BY part_role',
    [run.id],
  )).rows
  expect(readings).toEqual([
    {
      label: 'Sensor resistance at the pipe’s temperature', value: 118, unit: 'ohm', part_role: 'installed', verdict: 'low',
      conditions: 'key_off', part_c: '12',
    },
    {
      label: 'New sensor beside the old one', value: 215.6, unit: 'ohm', part_role: 'new', verdict: 'pass', conditions: 'key_off',
      part_c: '20',
    },
  ])
  await page.goto(`/m/calls/${CALL_5}/test`)
  const saved = page.getByRole('region', { name: 'Saved on this call' })
  await expect(saved).toContainText('Replace the exhaust temperature sensor')
  await expect(saved).toContainText('measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω (201.6–217.1 Ω for ± 10 °C); low')
  await shot(page, 'diag-run-summary-360')
  await ctx.close()
})

test('a data-valid exhaust code suggests the over-temperature card, not the sensor card', async ({ browser }) => {
  test.setTimeout(120_000)
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await firstSync(page, 'mech2@wayside.test')
  // Offline, and the context closed before signal comes back: the code added here never reaches the server.
  await ctx.setOffline(true)
  await page.goto(`/m/calls/${CALL_5}/test`)
  await page.getByText('Add a code read off the truck').click()
  await page.getByRole('radio', { name: 'SPN / FMI' }).click()
  await page.getByLabel('SPN', { exact: true }).fill('3242')
  // SAE J1939-73 FMI 0: data valid but above normal operating range, most severe: the exhaust really is too hot
  await page.getByLabel('FMI', { exact: true }).selectOption('0')
  await page.getByRole('button', { name: 'Add fault code' }).click()
  const fits = page.getByRole('region', { name: 'Fits this call\'s codes' })
  const hot = fits.getByRole('link', { name: /After-treatment running hot/ })
  await expect(hot).toContainText('For SPN 3242 FMI 0')
  const sensor = fits.getByRole('link', { name: /Exhaust temperature sensor/ })
  await expect(sensor).toContainText('For SPN 3242 FMI 4')
  await expect(sensor).not.toContainText('FMI 0')
  await fits.screenshot({ path: 'tests/e2e/screenshots/diag-suggest-condition-360.png' })
  await hot.click()
  await expect(page.getByRole('heading', { level: 1, name: /After-treatment running hot/ })).toBeVisible()
  await expect(page.getByText(/parked regeneration drives the exhaust above 500 °C/)).toBeVisible()
  await ctx.close()
})

test('fault codes at the card picker: decoded as typed, cleared, and flagged as returned when read again', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signIn(page, 'mech2@wayside.test')
  await expect(page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: /#5/ })).toBeVisible()
  // Marking a code cleared waits for the repair: the correction goes on record first, on the call page.
  await page.goto(`/m/calls/${CALL_5}`)
  await page.getByLabel(/^Correction/).fill('Replaced the exhaust temperature sensor.')
  await page.getByRole('button', { name: 'Save the story' }).click()
  await expect(page.getByText('Story saved on the phone')).toBeVisible()
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
  const titles = [
    'Exhaust temperature sensor (platinum RTD) and circuit', 'After-treatment running hot (exhaust over temperature)',
    'Coolant temperature sensor (NTC thermistor) and circuit', 'Engine running hot (coolant over temperature)',
    'DEF quality: concentration and contamination', '5 V sensor supply circuit',
    'Air brakes: build-up, governor, leakage, warning and spring brakes',
  ]
  for (const title of titles) await expect(page.getByRole('link', { name: title, exact: true })).toBeVisible()
  await page.getByLabel('Filter').fill('spn 3516')
  await expect(page.locator('tbody tr')).toHaveCount(1)
  await expect(page.locator('tbody tr')).toContainText('SPN 3516 FMI condition')
  await page.getByRole('link', { name: 'DEF quality: concentration and contamination' }).click()
  await expect(page.getByRole('heading', { level: 1, name: 'DEF quality: concentration and contamination' })).toBeVisible()
  // ISO 22241-1 window as seeded, with the refractometer's ± 0.5 % as the margin (common practice)
  const pct = page.getByRole('group', { name: 'Step 4' })
  await expect(pct.getByLabel('Min (%)')).toHaveValue('31.8')
  await expect(pct.getByLabel('Max (%)')).toHaveValue('33.2')
  await expect(pct.getByLabel('Margin (%, optional)')).toHaveValue('0.5')

  // A new step left blank, and a blank title: the form names each problem where it is.
  await page.getByRole('group', { name: 'Step 1' }).getByLabel('Title').fill('')
  await page.getByRole('button', { name: 'Add a step' }).click()
  await page.getByRole('button', { name: 'Save as version 2' }).click()
  await expect(page.getByRole('group', { name: 'Step 1' }).getByText('Enter a short title')).toBeVisible()
  await expect(page.getByRole('group', { name: 'Step 6' }).getByText('Pick where this leads').first()).toBeVisible()
  await page.getByRole('button', { name: 'Remove step 6' }).click()
  await page.getByRole('group', { name: 'Step 1' }).getByLabel('Title').fill('Sample clear, clean and free of crystals')
  await page.getByRole('button', { name: 'Save as version 2' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Saved as version 2' })).toBeVisible()
  await expect(page.getByText('version 2 · in use')).toBeVisible()
  const r = await testPool().query('SELECT current_version FROM test_cards WHERE slug = \'def-concentration\'')
  expect(r.rows[0].current_version).toBe(2)
})

test('the admin enters the maker’s table for the coolant sensor, and the card judges with it', async ({ page }) => {
  await page.setViewportSize({ width: 1280, height: 900 })
  await signIn(page, 'admin@wayside.test')
  await page.goto(`/setup/cards/${seedId('card:coolant-temp-ntc')}`)
  await expect(page.getByRole('heading', { level: 1, name: 'Coolant temperature sensor (NTC thermistor) and circuit' })).toBeVisible()
  const sensor = page.getByRole('group', { name: 'Step 4' })
  await expect(sensor.getByLabel('Title')).toHaveValue('Sensor resistance at its own temperature')
  await expect(sensor.getByLabel('Kind')).toHaveValue('needs_maker_data')
  await sensor.scrollIntoViewIfNeeded()
  await sensor.screenshot({ path: 'tests/e2e/screenshots/diag-setup-step-no-data-1280.png' })
  await sensor.getByLabel('Kind').selectOption('ntc_table')
  // A row out of order is named by its row.
  await sensor.getByLabel(/The maker’s table/).fill('0, 27219\n25, 10000\n20, 12081')
  await page.getByRole('button', { name: 'Save as version 2' }).click()
  await expect(sensor.getByText(/Row 3: Rows go from cold to hot/)).toBeVisible()
  // Murata NCP15XH103 table rows (°C, Ω), as the maker publishes them
  await sensor.getByLabel(/The maker’s table/).fill('-20, 68237\n0, 27219\n10, 17926\n20, 12081\n25, 10000\n30, 8315\n50, 4161\n80, 1669\n100, 974')
  await expect(sensor.getByLabel('Tolerance as')).toHaveValue('degC')
  await sensor.getByLabel('± °C (through the sensor’s curve)').fill('2')
  await sensor.screenshot({ path: 'tests/e2e/screenshots/diag-setup-step-table-1280.png' })
  await page.getByRole('button', { name: 'Save as version 2' }).click()
  await expect(page.getByRole('status').filter({ hasText: 'Saved as version 2' })).toBeVisible()
  await shot(page, 'diag-setup-card-1280')
  const { rows: [v] } = await testPool().query(
    'SELECT v.definition FROM test_card_versions v JOIN test_cards c ON c.id = v.card_id '
    + 'WHERE c.slug = \'coolant-temp-ntc\' AND v.card_version = 2',
  )
  const step = v.definition.steps.find((s: { id: string }) => s.id === 'ect-ohms')
  expect(step.spec).toMatchObject({ kind: 'ntc_table', toleranceC: 2 })
  expect(step.spec.table[3]).toEqual([20, 12081])
  // The card now judges: the 20 °C row at 20 °C passes (Murata NCP15XH103 table).
  const judged = await page.request.post(`/api/test-cards/${seedId('card:coolant-temp-ntc')}/judge`, {
    headers: { 'x-wayside': '1' },
    data: { stepId: 'ect-ohms', reading: { value: 12081, unit: 'ohm' }, partTemp: { value: 20, unit: 'degC' } },
  })
  expect(await judged.json()).toMatchObject({ verdict: 'pass', version: 2 })
})
