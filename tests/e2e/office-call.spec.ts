// The office's call page tells what happened at the truck: the scene checklist, the repair's
// verification, the guided test run step by step, and readings as people write them.
import { randomUUID } from 'node:crypto'
import { expect, test, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { signedIn } from '../support/api'
import { testPool } from '../support/db'
import { PHONE, signIn } from './helpers'

const MECH2 = seedId('user:mech2')

/** A call of the test's own, on site with mech2, so no other test's demo call moves. */
async function makeCall() {
  const id = randomUUID()
  await testPool().query(
    `INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id, assigned_at, on_site_at)
     VALUES ($1, 'on_site', $2, $3, 'Highway 12 eastbound shoulder, mile 20', 'Exhaust temperature lamp, derated', $4, now(), now())`,
    [id, seedId('customer:ironwood'), seedId('unit:4'), MECH2],
  )
  return id
}

/** What the phone would push after a card run, the scene checklist and the repair checks. */
async function pushFieldWork(callId: string) {
  const api = await signedIn('mech2@wayside.test')
  const card = ((await api.get('/api/test-cards')).body as { items: { id: string, title: string, version: number }[] }).items[0]!
  const cardVersion = card.version
  const call = (await api.get(`/api/calls/${callId}`)).body as { version: number }
  const clientId = randomUUID()
  let seq = 0
  type Changes = Record<string, unknown>
  const op = (entity: string, action: 'create' | 'update', entityId: string, changes: Changes, extra: Changes = {}) => ({
    opId: randomUUID(), clientId, seq: ++seq, at: new Date().toISOString(), schemaVersion: 1, entity, entityId, action, changes, ...extra,
  })
  const runId = randomUUID()
  // IEC 60751 scaled to 200 Ω: a Pt200 at 12 °C reads 209.363288 Ω; ± 2 % is 205.18–213.55 Ω
  const spec = { nominal: 209.363288, tolerancePct: 2 }
  const step = {
    stepId: 'resistance', title: 'Sensor resistance at ambient', measure: 'resistance', at: new Date().toISOString(),
    entered: { value: 118, unit: 'ohm' }, value: 118, unit: 'ohm', verdict: 'low', spec, specText: '209.4 Ω ± 2 %',
    explanation: 'measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω ± 2 %; low', next: 'done',
  }
  const ops = [
    op('call', 'update', callId, { sceneChecklist: { hazard_lamps: true, warning_devices: true, high_visibility: true, tire_cage: true } },
      { base: { sceneChecklist: null }, baseVersion: call.version }),
    op('testRun', 'create', runId, {
      callId, cardId: card.id, cardVersion, ambientC: 12, steps: [step], conclusion: 'Replace sensor', finishedAt: new Date().toISOString(),
    }),
    op('reading', 'create', randomUUID(), {
      callId, testRunId: runId, stepId: 'resistance', label: 'Sensor resistance at ambient', quantity: 'resistance',
      value: 118, unit: 'ohm', component: 'Exhaust temperature sensor 1', conditions: 'key_off', partRole: 'installed',
      spec: { ...spec, text: '209.4 Ω ± 2 %' }, verdict: 'low',
    }),
    op('reading', 'create', randomUUID(), {
      callId, label: 'Coolant', quantity: 'temperature', value: -40, unit: 'degC', component: 'Coolant', conditions: 'key_on_engine_off',
      spec: { min: -5.57, max: 25.57, text: 'within 15.57 °C of the median of 4 like sensors, engine off 10 h' }, verdict: 'low',
    }),
    op('call', 'update', callId, {
      verification: {
        codesCleared: true, liveValuesChecked: true, lampsOff: true, derateGone: true, testDriveKm: 12, testDriveMinutes: 15,
        liveValuesNote: 'All four exhaust temperatures within 6 °C at idle', passed: true, checkedAt: new Date().toISOString(),
        distanceUnit: 'km',
      },
    }, { base: { verification: null }, baseVersion: call.version }),
  ]
  const r = await api.post('/api/sync/push', { clientId, ops })
  expect(r.status).toBe(200)
  expect(r.body.results.map((x: { status: string }) => x.status)).toEqual(ops.map(() => 'applied'))
  return card.title
}

const shot = (page: Page, name: string) => page.screenshot({ path: `tests/e2e/screenshots/${name}.png`, fullPage: true })

test('the office call page: scene, verification, the test run, readings as people write them', async ({ browser }) => {
  const callId = await makeCall()
  const cardTitle = await pushFieldWork(callId)
  for (const [viewport, name] of [[{ width: 1280, height: 900 }, 'office-call-1280'], [PHONE, 'office-call-360']] as const) {
    const ctx = await browser.newContext({ viewport })
    const page = await ctx.newPage()
    await signIn(page, 'office@wayside.test')
    await page.goto(`/calls/${callId}`)
    const scene = page.getByRole('region', { name: /Scene safety/ })
    await expect(scene).toContainText('3 of 7 every-call checks')
    await expect(scene.getByRole('list', { name: 'Job checks ticked' })).toContainText('restraining cage')
    const verification = page.getByRole('region', { name: /Verification/ })
    await expect(verification).toContainText('repair verified')
    await expect(verification).toContainText('12 km, 15 min')
    await expect(verification).toContainText('All four exhaust temperatures within 6 °C at idle')
    const run = page.getByRole('region', { name: `Test run: ${cardTitle}` })
    await expect(run).toContainText('Replace sensor')
    await expect(run).toContainText('118 Ω')
    const work = page.getByRole('region', { name: /Fault codes, readings and test runs/ })
    // IEC 60751 Pt200 at 12 °C ± 2 %: 209.4 Ω, limits 205.2–213.6 Ω
    await expect(work).toContainText('209.4 Ω ± 2 % (205.2–213.6 Ω)')
    await expect(work).toContainText('key on, engine off')
    await expect(work).toContainText('-40 °C')
    await expect(work).toContainText('within 15.57 °C of the median of 4 like sensors')
    for (const raw of ['209.363288', 'key_on_engine_off', 'degC', 'key_off']) await expect(page.locator('main')).not.toContainText(raw)
    // Nothing wider than the screen: wide tables scroll inside their card.
    expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(viewport.width)
    await shot(page, name)
    await ctx.close()
  }
})
