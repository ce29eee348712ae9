// The heart of Wayside: a whole call worked on the phone with no signal, nothing lost across
// reloads, and all of it at the office after the phone is back in signal.
import { expect, test, type Page } from '@playwright/test'
import { count, testPool } from '../support/db'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

/** Nothing waits on the phone and no pass is running (open conflicts of other tests may remain). */
async function allSent(page: Page, timeout = 30_000) {
  const chip = page.getByTestId('sync-chip')
  await expect(chip).toHaveAttribute('data-waiting', '0', { timeout })
  await expect(chip).not.toHaveAttribute('data-state', /syncing|paused|rejected/, { timeout })
}

const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })

async function callIdByNumber(page: Page, label: RegExp) {
  const link = page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: label })
  await expect(link).toBeVisible()
  return (await link.getAttribute('href'))!.split('/').pop()!
}

async function addReading(
  page: Page,
  r: { label: string, kind: string, unit: string, value: string, where: string, conditions: string, min?: string, max?: string },
) {
  await page.getByLabel('What was measured').fill(r.label)
  await page.getByLabel('Kind').selectOption(r.kind)
  await page.getByLabel('Unit', { exact: true }).selectOption(r.unit)
  await page.getByLabel('Value', { exact: true }).fill(r.value)
  await page.getByLabel('Where taken').fill(r.where)
  await page.getByLabel('Conditions').fill(r.conditions)
  if (r.min !== undefined) {
    const spec = page.getByRole('button', { name: 'Judge against a spec' })
    if (await spec.isVisible()) await spec.click()
    await page.getByLabel('Low limit').fill(r.min)
    await page.getByLabel('High limit').fill(r.max ?? '')
  }
  await page.getByRole('button', { name: 'Add reading' }).click()
  await expect(page.getByRole('list', { name: 'Readings recorded' }).getByText(r.label)).toBeVisible()
}

test('a whole call worked offline reaches the office after sync', async ({ browser }) => {
  test.slow() // three times the limit, which itself stretches with the machine's load
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  let page = await ctx.newPage()
  await signIn(page, 'mech1@wayside.test')
  await waitForServiceWorker(page)
  const callId = await callIdByNumber(page, /^#3 · Ironwood/)
  // One online visit of the call.
  await page.goto(`/m/calls/${callId}`)
  await expect(page.getByRole('heading', { level: 1, name: 'Call #3' })).toBeVisible()
  // The header's; the sign-off summary repeats the complaint further down.
  await expect(page.getByText('DEF lamp flashing').first()).toBeVisible()

  // What the server holds already, so the checks below count only what this test adds.
  const TABLES = ['fault_codes', 'readings', 'notes', 'photos', 'part_lines', 'sign_offs', 'clock_events'] as const
  const before = Object.fromEntries(await Promise.all(TABLES.map(async t => [t, await count(t, 'call_id = $1', [callId])] as const)))
  const started = new Date()

  // No signal from here on; close the app and open it again.
  await ctx.setOffline(true)
  await page.close()
  page = await ctx.newPage()
  await page.goto(`/m/calls/${callId}`)
  await expect(page.getByRole('heading', { level: 1, name: 'Call #3' })).toBeVisible()
  await expect(page.getByText('No signal').first()).toBeVisible()
  await expect(page.getByText('Ironwood Freight Lines').first()).toBeVisible()
  // The unit's earlier call is on the phone too.
  await expect(page.getByText('Cause: DEF concentration 26 % by refractometer (diluted).')).toBeVisible()

  // Status steps; each writes its clock event.
  await page.getByRole('button', { name: 'Start driving' }).click()
  await expect(page.getByRole('listitem').filter({ hasText: 'Driving out' }).first()).toHaveAttribute('aria-current', 'step')
  await page.getByRole('button', { name: 'Arrived at the truck' }).click()
  await expect(page.getByRole('button', { name: 'Start work' })).toBeVisible()
  await shot(page, 'field-call-on-site-360')
  await page.getByRole('button', { name: 'Start work' }).click()
  await expect(page.getByText('Labor · running')).toBeVisible()

  // Scene safety.
  await expect(page.getByTestId('warning-devices')).toContainText('3 m (10 ft)')
  await page.getByRole('radio', { name: 'Divided / one-way' }).click()
  await expect(page.getByTestId('warning-devices')).toContainText('61 m (200 ft)')
  await page.getByLabel(/Hazard flashers on/).check()
  await page.getByLabel(/High-visibility vest/).check()

  // A fault code, decoded as typed.
  await page.getByRole('button', { name: 'Add a fault code' }).click()
  await page.getByLabel('SPN', { exact: true }).fill('110')
  await page.getByLabel('FMI', { exact: true }).selectOption('0')
  await expect(page.getByTestId('fault-decoded')).toContainText('Engine coolant temperature')
  await page.getByLabel('Times seen').fill('2')
  await page.getByRole('button', { name: 'Add fault code' }).click()
  await expect(page.getByRole('list', { name: 'Fault codes recorded' })).toContainText('SPN 110 FMI 0')

  // Three readings, one judged against a spec.
  await page.getByRole('button', { name: 'Add a reading' }).click()
  await addReading(page, {
    label: 'DEF concentration', kind: 'concentration', unit: '%', value: '26,5', where: 'DEF tank', conditions: 'Engine stopped',
    min: '31.8', max: '33.2',
  })
  await expect(page.getByRole('list', { name: 'Readings recorded' })).toContainText('Low')
  await addReading(page, {
    label: 'Battery at rest', kind: 'voltage', unit: 'V', value: '12.6', where: 'Battery posts', conditions: 'Key on, engine off',
  })
  await addReading(page, {
    label: 'DEF heater resistance', kind: 'resistance', unit: 'ohm', value: '7.9', where: 'Heater connector',
    conditions: 'Key off, connector unplugged',
  })

  // A note and two photos.
  await page.getByRole('button', { name: 'Write a note' }).click()
  await page.getByLabel('New note').fill('Drained the diluted DEF; yard tank suspected.')
  await page.getByRole('button', { name: 'Add note' }).click()
  await page.getByLabel('Caption (optional)').fill('DEF filler neck')
  await page.locator('#ph-file').setInputFiles('tests/e2e/fixtures/harness.jpg')
  await expect(page.getByRole('list', { name: 'Photos taken' }).getByRole('img')).toHaveCount(1)
  await page.locator('#ph-file').setInputFiles('tests/e2e/fixtures/sensor.jpg')
  await expect(page.getByRole('list', { name: 'Photos taken' }).getByRole('img')).toHaveCount(2)

  // A part from the service truck's stock, cached on the phone by the first sync.
  await page.getByRole('button', { name: 'Add a part' }).click()
  await page.getByLabel('From the truck\'s stock').selectOption({ label: 'TR-DEF-10 · DEF (AUS 32), 10 L jug' })
  await expect(page.getByLabel('Unit price')).toHaveValue('24.00')
  await page.getByLabel('Quantity').fill('3')
  await page.getByRole('button', { name: 'Add part' }).click()
  await expect(page.getByRole('list', { name: 'Parts used' })).toContainText('TR-DEF-10')

  // The story.
  await page.getByLabel(/^Cause/).fill('DEF diluted to 26.5 % by refractometer.')
  await page.getByLabel(/^Correction/).fill('Drained tank, refilled 30 L fresh DEF, cleared codes.')
  await page.getByRole('button', { name: 'Save the story' }).click()
  await expect(page.getByText('Story saved on the phone')).toBeVisible()

  // Verification.
  await page.getByLabel('Fault codes cleared and not back').check()
  await page.getByLabel(/Live values re-read/).check()
  await page.getByLabel('Warning lamps off').check()
  await page.getByLabel(/Derate gone/).check()
  await page.getByLabel(/^Distance/).fill('8')
  await page.getByRole('button', { name: 'Save the checks' }).click()
  await expect(page.getByText('Verified: saved on the phone')).toBeVisible()

  // Finish the call.
  await page.getByRole('button', { name: /Stop work/ }).click()
  await page.getByRole('button', { name: 'Finish the call' }).click()
  await page.getByRole('button', { name: 'Repaired at the roadside' }).click()
  await expect(page.getByText('Work done: Repaired at the roadside')).toBeVisible()

  // The driver signs.
  await page.getByLabel('Driver\'s name').fill('K. Okafor')
  const pad = page.getByTestId('signature-pad')
  await pad.scrollIntoViewIfNeeded()
  const box = (await pad.boundingBox())!
  await page.mouse.move(box.x + 20, box.y + box.height / 2)
  await page.mouse.down()
  for (let i = 1; i <= 12; i++) await page.mouse.move(box.x + 20 + i * 22, box.y + box.height / 2 + (i % 2 ? -30 : 30), { steps: 3 })
  await page.mouse.up()
  await page.getByRole('button', { name: 'Save sign-off' }).click()
  await expect(page.getByTestId('signed')).toContainText('K. Okafor')

  await expect(page.getByTestId('waiting-mark').first()).toBeVisible()
  await expect(page.getByTestId('sync-chip')).toContainText('waiting')
  await shot(page, 'field-call-done-offline-360')
  // One picture per section too, at phone size, to look at.
  for (const [name, heading] of [
    ['header', 'call-title'], ['steps', 'steps-title'], ['scene', 'scene-title'], ['codes', 'codes-title'], ['readings', 'readings-title'],
    ['photos', 'photos-title'], ['parts', 'parts-title'], ['story', 'story-title'], ['verify', 'verify-title'], ['signoff', 'sign-title'],
  ]) {
    await page.locator(`section[aria-labelledby="${heading}"]`).screenshot({ path: `tests/e2e/screenshots/field-section-${name}.png` })
  }
  await page.evaluate(() => window.scrollTo(0, 0))
  await page.screenshot({ path: 'tests/e2e/screenshots/field-call-top-360.png' })

  // A reload with no signal loses nothing.
  await page.reload()
  await expect(page.getByRole('heading', { level: 1, name: 'Call #3' })).toBeVisible()
  for (const text of [
    'SPN 110 FMI 0', 'DEF concentration', 'Battery at rest', 'DEF heater resistance', 'Drained the diluted DEF', 'TR-DEF-10', 'K. Okafor',
    'Work done: Repaired at the roadside',
  ]) {
    // The first one shown: the estimate's folded list of lines names the part too.
    await expect(page.getByText(text).filter({ visible: true }).first()).toBeVisible()
  }
  await expect(page.getByLabel(/^Cause/)).toHaveValue('DEF diluted to 26.5 % by refractometer.')
  await expect(page.getByRole('list', { name: 'Photos taken' }).getByRole('img')).toHaveCount(2)
  await expect(page.getByText('Verified', { exact: true })).toBeVisible()

  // Back in signal: it syncs by itself.
  await ctx.setOffline(false)
  await allSent(page)
  await expect(page.getByTestId('waiting-mark')).toHaveCount(0)
  await shot(page, 'field-call-synced-360')

  // Every item is on the server, once.
  const added = async (t: (typeof TABLES)[number], extra = 'true') =>
    (await count(t, `call_id = $1 AND ${extra}`, [callId])) - (extra === 'true' ? before[t]! : 0)
  expect(await added('fault_codes')).toBe(1)
  expect(await added('readings')).toBe(3)
  expect(await added('notes')).toBe(1)
  expect(await added('photos')).toBe(2)
  expect(await added('photos', `storage_key IS NOT NULL AND created_at >= '${started.toISOString()}'`)).toBe(2)
  expect(await added('part_lines')).toBe(1)
  expect(await added('sign_offs')).toBe(1)
  const clock = await testPool().query(
    'SELECT kind FROM clock_events WHERE call_id = $1 AND created_at >= $2 ORDER BY device_at', [callId, started],
  )
  expect(clock.rows.map(r => r.kind)).toEqual(['travel_start', 'arrive', 'work_start', 'work_stop', 'depart'])
  const part = (await testPool().query(
    'SELECT part_number, quantity, unit_price_cents, service_truck_id FROM part_lines WHERE call_id = $1 AND created_at >= $2',
    [callId, started],
  )).rows
  expect(part).toEqual([{ part_number: 'TR-DEF-10', quantity: 3, unit_price_cents: 2400, service_truck_id: expect.any(String) }])
  const call = (await testPool().query(
    'SELECT status, outcome, story_cause, verification, scene_checklist FROM calls WHERE id = $1', [callId],
  )).rows[0]
  expect(call).toMatchObject({ status: 'completed', outcome: 'repaired', story_cause: 'DEF diluted to 26.5 % by refractometer.' })
  expect(call.verification).toMatchObject({ codesCleared: true, lampsOff: true, testDriveKm: 8, passed: true })
  expect(call.scene_checklist).toMatchObject({ hazard_lamps: true, high_visibility: true })
  const reading = (await testPool().query(
    'SELECT value, unit, verdict FROM readings WHERE call_id = $1 AND label = \'DEF concentration\'', [callId],
  )).rows[0]
  expect(reading).toEqual({ value: 26.5, unit: '%', verdict: 'low' })

  // The office finds every item on its call page, and the photos' bytes are the phone's.
  const office = await browser.newContext({ viewport: { width: 1280, height: 900 } })
  const op = await office.newPage()
  await signIn(op, 'office@wayside.test')
  await op.goto(`/calls/${callId}`)
  await expect(op.getByRole('heading', { level: 1, name: 'Call #3' })).toBeVisible()
  const work = op.locator('section[aria-labelledby="work-heading"]')
  await expect(work).toContainText('SPN 110 FMI 0')
  for (const label of ['DEF concentration', 'Battery at rest', 'DEF heater resistance']) await expect(work).toContainText(label)
  await expect(work).toContainText('26.5')
  const notes = op.locator('section[aria-labelledby="notes-heading"]')
  await expect(notes).toContainText('Drained the diluted DEF; yard tank suspected.')
  await expect(notes.getByRole('img')).toHaveCount(2)
  await expect(notes.getByRole('img', { name: 'DEF filler neck' })).toBeVisible()
  const story = op.locator('section[aria-labelledby="story-heading"]')
  await expect(story).toContainText('DEF diluted to 26.5 % by refractometer.')
  await expect(story).toContainText('Drained tank, refilled 30 L fresh DEF, cleared codes.')
  await expect(story).toContainText('Repaired at the roadside')
  await expect(story.getByRole('img', { name: 'Signature of K. Okafor' })).toBeVisible()
  await expect(op.locator('section[aria-labelledby="time-heading"]')).toContainText('TR-DEF-10')
  await op.screenshot({ path: 'tests/e2e/screenshots/field-synced-office-call-1280.png', fullPage: true })
  const photoIds = (await testPool().query('SELECT id, sha256 FROM photos WHERE call_id = $1 AND created_at >= $2', [callId, started])).rows
  for (const p of photoIds) {
    const r = await op.request.get(`/api/photos/${p.id}`)
    expect(r.status()).toBe(200)
    expect(r.headers()['content-type']).toBe('image/jpeg')
    const { createHash } = await import('node:crypto')
    expect(createHash('sha256').update(await r.body()).digest('hex')).toBe(p.sha256)
  }
  await office.close()
  await ctx.close()
})

async function addNote(page: Page, text: string) {
  await expect(page.getByRole('heading', { name: /^Notes \(/ })).toBeVisible()
  const open = page.getByRole('button', { name: 'Write a note' })
  if (await open.isVisible()) await open.click()
  await page.getByLabel('New note').fill(text)
  await page.getByRole('button', { name: 'Add note' }).click()
  await expect(page.getByRole('list', { name: 'Notes written' }).getByText(text)).toBeVisible()
}

test('two tabs with work waiting come online together: one syncs at a time, no duplicates', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const a = await ctx.newPage()
  await signIn(a, 'mech1@wayside.test')
  await waitForServiceWorker(a)
  const callId = await callIdByNumber(a, /^#4 · Lakeline/)
  await a.goto(`/m/calls/${callId}`)
  const b = await ctx.newPage()
  await b.goto(`/m/calls/${callId}`)
  await expect(b.getByRole('heading', { level: 1, name: 'Call #4' })).toBeVisible()
  await allSent(a)
  const notesBefore = await count('notes', 'call_id = $1', [callId])
  const opsBefore = await count('sync_ops')

  await ctx.setOffline(true)
  const tag = Date.now()
  await addNote(a, `Tab A: thermostat housing wet ${tag}`)
  await addNote(b, `Tab B: coolant level low ${tag}`)
  await addNote(a, `Tab A: topped up coolant ${tag}`)
  await addNote(b, `Tab B: pressure test holds ${tag}`)

  // Every sync request each tab makes, with when it started and ended.
  const spans: { tab: string, url: string, start: number, end: number }[] = []
  for (const [tab, p] of [['a', a], ['b', b]] as const) {
    const open = new Map<object, { tab: string, url: string, start: number, end: number }>()
    p.on('request', (r) => {
      if (r.url().includes('/api/sync/')) {
        const s = { tab, url: r.url(), start: Date.now(), end: 0 }
        open.set(r, s)
        spans.push(s)
      }
    })
    p.on('requestfinished', (r) => { const s = open.get(r); if (s) s.end = Date.now() })
    p.on('requestfailed', (r) => { const s = open.get(r); if (s) s.end = Date.now() })
  }
  await ctx.setOffline(false)
  await allSent(a)
  await allSent(b)
  await expect.poll(() => count('notes', 'call_id = $1', [callId])).toBe(notesBefore + 4)
  // Exactly one stored op per change: nothing was applied twice.
  expect(await count('sync_ops')).toBe(opsBefore + 4)
  const pushes = spans.filter(s => s.url.endsWith('/api/sync/push'))
  expect(pushes.length).toBeGreaterThan(0)
  // The lock: no sync request of one tab overlaps one of the other.
  for (const x of spans) for (const y of spans) {
    if (x.tab !== y.tab) expect(x.end <= y.start || y.end <= x.start, `${x.tab} ${x.url} overlaps ${y.tab} ${y.url}`).toBe(true)
  }
  await ctx.close()
})

test('signing out with unsynced work warns first, and keeps the work', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const page = await ctx.newPage()
  await signIn(page, 'mech1@wayside.test')
  await waitForServiceWorker(page)
  const callId = await callIdByNumber(page, /^#4 · Lakeline/)
  await page.goto(`/m/calls/${callId}`)
  await ctx.setOffline(true)
  const text = `Waiting for the sign-out test ${Date.now()}`
  await addNote(page, text)
  // The sync panel says what waits.
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sync' }).click()
  await expect(page.getByTestId('waiting-count')).toContainText('1 change waits to sync')
  await expect(page.getByRole('region', { name: /Waiting to send/ })).toContainText(text.slice(0, 30))
  await expect(page.getByText('No signal. Work is kept on the phone')).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/field-sync-panel-360.png', fullPage: true })
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click()
  await page.getByRole('button', { name: 'Sign out' }).click()
  const warn = page.getByRole('alertdialog')
  await expect(warn).toContainText('1 change has not reached the office yet')
  await page.screenshot({ path: 'tests/e2e/screenshots/field-signout-warning-360.png', fullPage: true })
  await page.getByRole('button', { name: 'Stay signed in' }).click()
  await expect(page).toHaveURL(/\/m\/settings$/)

  // Signing out anyway keeps the queue on the phone; it goes once the same person signs in again.
  await page.getByRole('button', { name: 'Sign out' }).click()
  await page.getByRole('button', { name: 'Sign out anyway' }).click()
  await expect(page).toHaveURL(/\/login/)
  // Checked while still offline: signing out dropped nothing from the phone's queue. (Once back
  // online the sign-out cannot be confirmed to the server first, so when the note lands is not fixed.)
  expect(await count('notes', 'call_id = $1 AND text = $2', [callId, text])).toBe(0)
  await ctx.setOffline(false)
  await signIn(page, 'mech1@wayside.test')
  await expect.poll(() => count('notes', 'call_id = $1 AND text = $2', [callId, text]), { timeout: 30_000 }).toBe(1)
  await allSent(page)
  // Nothing waits now: signing out asks nothing.
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Settings' }).click()
  await page.getByRole('button', { name: 'Sign out' }).click()
  await expect(page).toHaveURL(/\/login/)
  await ctx.close()
})

test('a field changed on two phones from the same start is settled on the phone', async ({ browser }) => {
  const phones = await Promise.all([0, 1].map(() => browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })))
  const pages = await Promise.all(phones.map(p => p.newPage()))
  let callId = ''
  for (const p of pages) {
    await signIn(p, 'mech1@wayside.test')
    await waitForServiceWorker(p)
    callId = await callIdByNumber(p, /^#4 · Lakeline/)
    await p.goto(`/m/calls/${callId}`)
    await expect(p.getByRole('heading', { level: 1, name: 'Call #4' })).toBeVisible()
    await allSent(p)
  }
  const [a, b] = pages as [Page, Page]
  await Promise.all(phones.map(p => p.setOffline(true)))
  for (const [p, text] of [[a, 'Thermostat stuck open'], [b, 'Coolant sensor open circuit']] as const) {
    await p.getByLabel(/^Cause/).fill(text)
    await p.getByRole('button', { name: 'Save the story' }).click()
    await expect(p.getByText('Story saved on the phone')).toBeVisible()
  }
  // Phone A gets signal first; phone B's change then meets A's on the server.
  await phones[0]!.setOffline(false)
  await allSent(a)
  await phones[1]!.setOffline(false)
  const conflict = b.getByRole('article', { name: 'Conflict on Cause' })
  await expect(conflict).toBeVisible({ timeout: 30_000 })
  await expect(conflict.getByTestId('device-value')).toHaveText('Coolant sensor open circuit')
  await expect(conflict.getByTestId('server-value')).toHaveText('Thermostat stuck open')
  await expect(b.getByTestId('sync-chip')).toHaveAttribute('data-state', 'settle')
  await conflict.scrollIntoViewIfNeeded()
  await b.screenshot({ path: 'tests/e2e/screenshots/field-conflict-360.png' })
  expect(await count('conflicts', 'call_id = $1 AND field = \'storyCause\' AND status = \'open\'', [callId])).toBe(1)

  await conflict.getByLabel('Or type the right value').fill('Thermostat stuck open; sensor reads true')
  await conflict.getByRole('button', { name: 'Keep what I typed' }).click()
  await expect(b.getByRole('article', { name: 'Conflict on Cause' })).toHaveCount(0, { timeout: 30_000 })
  await expect.poll(
    async () => (await testPool().query('SELECT story_cause FROM calls WHERE id = $1', [callId])).rows[0].story_cause, { timeout: 30_000 },
  )
    .toBe('Thermostat stuck open; sensor reads true')
  expect(await count(
    'conflicts', 'call_id = $1 AND field = \'storyCause\' AND status = \'resolved\' AND choice = \'value\'', [callId],
  )).toBe(1)
  await expect(b.getByLabel(/^Cause/)).toHaveValue('Thermostat stuck open; sensor reads true')
  await Promise.all(phones.map(p => p.close()))
})

test('with consent, the last known position goes with the next sync; the question is asked once', async ({ browser }) => {
  const ctx = await browser.newContext({
    viewport: PHONE, isMobile: true, hasTouch: true, geolocation: { latitude: 45.4123, longitude: -93.2345 }, permissions: ['geolocation'],
  })
  const page = await ctx.newPage()
  await signIn(page, 'mech2@wayside.test')
  const ask = page.getByRole('dialog', { name: /Share where you are/ })
  await expect(ask).toBeVisible()
  await ask.getByRole('button', { name: 'Yes, share it when syncing' }).click()
  await expect(ask).toHaveCount(0)
  await page.getByRole('button', { name: 'Sync now' }).click()
  await expect.poll(
    async () => (await testPool().query('SELECT last_lat, last_lon FROM users WHERE email = \'mech2@wayside.test\'')).rows[0],
    { timeout: 30_000 },
  )
    .toEqual({ last_lat: 45.4123, last_lon: -93.2345 })
  await page.reload()
  await expect(page.getByRole('heading', { level: 1, name: 'My calls' })).toBeVisible()
  await expect(page.getByRole('dialog', { name: /Share where you are/ })).toHaveCount(0)
  await ctx.close()
})
