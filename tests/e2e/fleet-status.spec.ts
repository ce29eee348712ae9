// The fleet follows its truck on a phone, without an account: the dispatcher makes the link on the
// call page, the fleet opens it at 360 px while the mechanic drives out, and again once the work is done.
import { execFileSync } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { mkdirSync, writeFileSync } from 'node:fs'
import { expect, test } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'
import { PHONE, signIn } from './helpers'

const MECH1 = seedId('user:mech1')

async function makeCall() {
  const id = randomUUID()
  const db = testPool()
  // The mechanic last seen a minute ago about 33 km south of the truck.
  const { rows: [m] } = await db.query(`UPDATE users SET last_position_at = now() - interval '1 minute' WHERE id = $1
    RETURNING last_lat AS lat, last_lon AS lon`, [MECH1])
  await db.query(
    `INSERT INTO calls (id, status, customer_id, unit_id, location_text, lat, lon, complaint, mechanic_id, caller_phone,
       received_at, assigned_at, en_route_at)
     VALUES ($1, 'en_route', $2, $3, 'Civic Loop at 3rd, curb lane', $5, $6, 'Battery lamp on, voltage low', $4, '612-555-0123',
       now() - interval '40 minutes', now() - interval '25 minutes', now() - interval '5 minutes')`,
    [id, seedId('customer:lakeline'), seedId('unit:14'), MECH1, m.lat + 0.3, m.lon],
  )
  return id
}

test('the fleet follows a call from driving out to done on a 360 px phone, in both themes', async ({ browser, page }) => {
  const callId = await makeCall()
  await page.setViewportSize({ width: 1280, height: 900 })
  await signIn(page, 'dispatch@wayside.test')
  await page.goto(`/calls/${callId}`)
  const panel = page.getByRole('region', { name: 'Share with the fleet' })
  await panel.getByRole('button', { name: 'Make a link to copy' }).click()
  const url = await panel.getByLabel('The link (shown only now)').inputValue()
  expect(url).toMatch(/\/s\/[\w-]{43}$/)
  await expect(panel.getByTestId('share-live')).toContainText('A link works until')
  await panel.screenshot({ path: 'tests/e2e/screenshots/fleet-share-panel.png' })

  // The fleet's phone: no session, no app bar.
  const fleet = await browser.newContext({ viewport: PHONE })
  const phone = await fleet.newPage()
  await phone.goto(url)
  await expect(phone.getByTestId('fleet-status')).toHaveText('The mechanic is driving out')
  await expect(phone.getByTestId('fleet-arrival')).toContainText(/Expected at the truck in (about|within about) \d+/)
  await expect(phone.getByText('Your mechanic:')).toBeVisible()
  await expect(phone.getByRole('link', { name: /dispatch|billing|sign out/i })).toHaveCount(0)
  await expect(phone.locator('body')).not.toContainText('612-555-0123')
  expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width)
  await phone.screenshot({ path: 'tests/e2e/screenshots/fleet-status-en-route.png', fullPage: true })

  // The mechanic reaches the truck, repairs it and syncs: the page shows what was done.
  await testPool().query(`UPDATE calls SET status = 'on_site', on_site_at = now() - interval '2 minutes' WHERE id = $1`, [callId])
  await testPool().query(`UPDATE calls SET status = 'completed', outcome = 'repaired', completed_at = now(),
    story_complaint = 'Battery lamp on, gauge low.', story_cause = 'Alternator output 12.3 V at 1500 rpm; belt and cables good.',
    story_correction = 'Replaced the alternator; 14.1 V under load. Road tested 10 km.',
    verification = '{"codesCleared": true, "lampsOff": true, "passed": true, "testDriveKm": 10, "testDriveMinutes": 12}'
    WHERE id = $1`, [callId])
  await testPool().query(`INSERT INTO fault_codes (call_id, spn, fmi, state, cleared_at) VALUES ($1, 167, 1, 'stored', now())`, [callId])
  await phone.reload()
  await expect(phone.getByTestId('fleet-status')).toHaveText('The work is finished')
  const work = phone.getByRole('region', { name: 'What was found and done' })
  await expect(work).toContainText('Replaced the alternator; 14.1 V under load.')
  await expect(work).toContainText('SPN 167 FMI 1')
  await expect(work).toContainText('Fault codes cleared and not back')
  expect(await phone.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(PHONE.width)
  await phone.screenshot({ path: 'tests/e2e/screenshots/fleet-status-done.png', fullPage: true })
  // The service report through the same link, its first page rendered for people to look at.
  const report = phone.getByRole('link', { name: 'Download the service report (PDF)' })
  const pdf = await phone.request.get(new URL(await report.getAttribute('href') ?? '', url).href)
  expect(pdf.headers()['content-type']).toBe('application/pdf')
  mkdirSync('test-results', { recursive: true })
  writeFileSync('test-results/service-report.pdf', await pdf.body())
  execFileSync('pdftoppm', ['-png', '-r', '80', '-f', '1', '-l', '1', '-singlefile', 'test-results/service-report.pdf',
    'tests/e2e/screenshots/fleet-service-report-page1'])
  await phone.getByRole('button', { name: 'Night' }).click()
  await expect(phone.locator('html')).toHaveClass(/theme-night/)
  await phone.screenshot({ path: 'tests/e2e/screenshots/fleet-status-done-night.png', fullPage: true })

  // Turned off from the call page: the same address now says the link does not work, as a 404.
  await panel.getByRole('button', { name: 'Turn off every link to this call' }).click()
  await expect(panel.getByTestId('share-live')).toHaveCount(0)
  const gone = await phone.goto(url)
  expect(gone?.status()).toBe(404)
  await expect(phone.getByRole('heading', { name: 'This link does not work' })).toBeVisible()
  await fleet.close()
})

test('the office sends the service report of a finished call to the fleet, confirming the address first', async ({ page }) => {
  const id = randomUUID()
  await testPool().query(
    `INSERT INTO calls (id, status, outcome, customer_id, unit_id, location_text, complaint, mechanic_id, story_complaint, story_cause,
       story_correction, received_at, assigned_at, en_route_at, on_site_at, completed_at)
     VALUES ($1, 'completed', 'repaired', $2, $3, 'Civic Loop at 3rd, curb lane', 'No crank', $4, 'No crank.',
       'Starter cable lug loose; 1.9 V drop while cranking.', 'Cleaned and tightened the lug; 0.3 V drop.',
       now() - interval '3 hours', now() - interval '170 minutes', now() - interval '160 minutes', now() - interval '2 hours',
       now() - interval '1 hour')`,
    [id, seedId('customer:lakeline'), seedId('unit:14'), MECH1],
  )
  await page.setViewportSize({ width: 1280, height: 900 })
  await signIn(page, 'office@wayside.test')
  await page.goto(`/calls/${id}`)
  const report = page.getByRole('region', { name: 'Service report' })
  await expect(report.getByRole('link', { name: 'Open the report (PDF)' })).toHaveAttribute('href', `/api/calls/${id}/report.pdf`)
  await expect(report.getByLabel('Send it to the fleet at')).toHaveValue('fleet.billing@lakeline.test')
  await report.getByRole('button', { name: 'Send the report…' }).click()
  const ask = report.getByRole('dialog')
  await expect(ask).toContainText('to fleet.billing@lakeline.test?')
  await report.screenshot({ path: 'tests/e2e/screenshots/fleet-report-send.png' })
  await ask.getByRole('button', { name: 'Send it' }).click()
  await expect(report.getByRole('status')).toContainText('On its way to fleet.billing@lakeline.test')
  await expect(page.getByRole('region', { name: 'Timeline' })).toContainText('Service report e-mailed to fleet.billing@lakeline.test')
})
