import { expect, test, type Locator, type Page } from '@playwright/test'
import { randomUUID } from 'node:crypto'
import { PHONE, signIn } from './helpers'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'

const DESK = { width: 1280, height: 800 }
const MAIL_URL = process.env.WAYSIDE_MAIL_URL ?? 'http://127.0.0.1:2601'

/** Presses Tab until `target` has the focus: the keyboard's way of getting to a field. */
async function tabTo(page: Page, target: Locator, max = 80) {
  for (let i = 0; i < max; i++) {
    if (await target.evaluate(el => el === document.activeElement)) return
    await page.keyboard.press('Tab')
  }
  throw new Error(`Tab never reached ${target}`)
}

test('a dispatcher takes a call from a blank form to assigned with the keyboard alone; '
  + 'the mechanic then sees it on the phone', async ({ browser }) => {
  const desk = await browser.newContext({ viewport: DESK })
  const page = await desk.newPage()
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/dispatch/new')
  await page.evaluate(() => Object.keys(localStorage).filter(k => k.startsWith('wayside:call-draft'))
    .forEach(k => localStorage.removeItem(k)))
  await page.reload()

  // The customer box has the focus on arrival: type, then Enter picks the highlighted match.
  const customer = page.getByRole('combobox', { name: 'Customer', exact: true })
  await expect(customer).toBeFocused()
  await page.keyboard.type('Prairie')
  await expect(page.getByRole('option', { name: /Prairie Cold Haul/ })).toBeVisible()
  await page.keyboard.press('Enter')
  await expect(customer).toHaveValue('Prairie Cold Haul')

  await page.keyboard.press('Tab')
  await expect(page.getByLabel('Caller', { exact: true })).toBeFocused()
  await page.keyboard.type('Jo, driver')
  await page.keyboard.press('Tab')
  await page.keyboard.type('555-0100')

  const unit = page.getByRole('combobox', { name: 'Unit', exact: true })
  await tabTo(page, unit)
  await page.keyboard.type('PR-149')
  await expect(page.getByRole('option', { name: /^PR-149 / })).toBeVisible()
  await page.keyboard.press('Enter')
  await expect(unit).toHaveValue('PR-149')

  await tabTo(page, page.getByLabel('Where is the truck'))
  await page.keyboard.type('Route 8 eastbound, mile 47, past the weigh station')
  await page.keyboard.press('Tab')
  await expect(page.getByLabel('Latitude')).toBeFocused()
  await page.keyboard.type('45.29, -93.08') // a pair typed into one box fills both once it is left
  await page.keyboard.press('Tab')
  await expect(page.getByLabel('Latitude')).toHaveValue('45.29')
  await expect(page.getByLabel('Longitude')).toHaveValue('-93.08')

  await tabTo(page, page.getByLabel('PO number'))
  await page.keyboard.type('PCH-7781')
  await page.keyboard.press('Tab')
  await page.keyboard.type('1200')

  await tabTo(page, page.getByLabel('Complaint, in the driver\'s words'))
  await page.keyboard.type('Stop-engine lamp flashed twice, now running rough under load')
  await tabTo(page, page.getByLabel('Stop engine'))
  await page.keyboard.press('Space')
  await expect(page.getByLabel('Stop engine')).toBeChecked()
  await tabTo(page, page.getByLabel('Loaded', { exact: true }))
  await page.keyboard.press('Space')
  await tabTo(page, page.getByLabel('Scene safety'))
  await page.keyboard.type('Wide shoulder, daylight; driver waits in the cab')

  await tabTo(page, page.getByRole('button', { name: 'Take call' }))
  await page.keyboard.press('Enter')
  await expect(page).toHaveURL(/\/calls\/[0-9a-f-]{36}$/)
  const heading = page.getByRole('heading', { level: 1, name: /Call #\d+/ })
  await expect(heading).toBeVisible()
  const number = (await heading.textContent())!.replace(/\D/g, '')
  await expect(page.getByText('Waiting for a mechanic').first()).toBeVisible()

  // Suggestions are ranked; the keyboard reaches the mechanic's Assign button.
  const assign = page.getByRole('button', { name: 'Assign Marco Lindqvist' })
  await tabTo(page, assign, 120)
  await page.keyboard.press('Enter')
  await expect(page.getByRole('status').filter({ hasText: 'Marco Lindqvist has the call' })).toBeVisible()
  await expect(page.locator('h1 + span', { hasText: 'Assigned' })).toBeVisible()
  await expect(page.getByRole('region', { name: 'Timeline' }).getByText('Assigned to Marco Lindqvist')).toBeVisible()
  // The notice is a mail job queued with the assignment: the worker sends it a moment later.
  const noticesFor = async () => {
    const mail = await (await fetch(`${MAIL_URL}/messages`)).json() as { to: string[], subject: string }[]
    return mail.filter(m => m.to.includes('mech1@wayside.test') && m.subject.includes(`#${number}:`)).length
  }
  await expect.poll(noticesFor, { timeout: 30_000 }).toBe(1)
  await desk.close()

  // The mechanic's phone home lists it after signing in.
  const phone = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const p = await phone.newPage()
  await signIn(p, 'mech1@wayside.test')
  await expect(p.getByRole('heading', { name: 'My calls' })).toBeVisible()
  await expect(p.getByText(`#${number}`, { exact: false }).first()).toBeVisible({ timeout: 20_000 })
  await expect(p.getByText('Route 8 eastbound, mile 47').first()).toBeVisible()
  await phone.close()
})

test('the form keeps what was typed if the page is closed by mistake, and says so', async ({ page }) => {
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/dispatch/new')
  await page.getByRole('button', { name: 'Start over' }).click()
  await page.getByRole('combobox', { name: 'Customer', exact: true }).fill('Bluestem')
  await page.getByRole('option', { name: /Bluestem Aggregate/ }).click()
  await page.getByLabel('Complaint, in the driver\'s words').fill('Air dryer purging constantly')
  await page.getByLabel('Hazmat on board').check()
  await expect(page.getByRole('note').filter({ hasText: 'Hazmat' })).toBeVisible()
  await page.waitForTimeout(400) // the draft is written a moment after typing stops
  await page.reload()
  await expect(page.getByRole('status').filter({ hasText: 'nothing was lost' })).toBeVisible()
  await expect(page.getByRole('combobox', { name: 'Customer', exact: true })).toHaveValue('Bluestem Aggregate Co.')
  await expect(page.getByLabel('Complaint, in the driver\'s words')).toHaveValue('Air dryer purging constantly')
  await expect(page.getByLabel('Hazmat on board')).toBeChecked()
  await page.getByRole('button', { name: 'Start a fresh one' }).click()
  await expect(page.getByLabel('Complaint, in the driver\'s words')).toHaveValue('')
  await page.reload()
  await expect(page.getByText('nothing was lost')).toHaveCount(0)
})

test('bad input is named beside each box; the VIN is checked as it is typed', async ({ page }) => {
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/dispatch/new')
  await page.getByRole('button', { name: 'Start over' }).click()
  await page.getByLabel('Latitude').fill('95')
  await page.getByLabel('Longitude').fill('-93')
  await page.getByLabel('Authorized up to ($)').fill('-50')
  await page.getByRole('button', { name: 'Take call' }).click()
  await expect(page.getByText('Pick the customer, or add a new one')).toBeVisible()
  await expect(page.getByText('Latitude is from -90 to 90')).toBeVisible()
  await expect(page.getByText('Authorization limit cannot be negative')).toBeVisible()
  await expect(page.getByText('Say where the truck is')).toBeVisible()
  await expect(page).toHaveURL(/\/dispatch\/new$/)

  // A position pasted as one "lat, lon" text lands in both boxes.
  await page.getByLabel('Latitude').evaluate((el) => {
    const data = new DataTransfer()
    data.setData('text', '45.1234, -93.2345')
    el.dispatchEvent(new ClipboardEvent('paste', { clipboardData: data, bubbles: true, cancelable: true }))
  })
  await expect(page.getByLabel('Latitude')).toHaveValue('45.1234')
  await expect(page.getByLabel('Longitude')).toHaveValue('-93.2345')

  // A new customer and unit inline; the VIN box answers at once.
  await page.getByRole('combobox', { name: 'Customer', exact: true }).fill('Harrow Bend Co-op')
  await page.getByRole('option', { name: /Add new customer/ }).click()
  await expect(page.getByLabel('Customer name')).toHaveValue('Harrow Bend Co-op')
  const vin = page.locator('#call-new-unit-vin')
  await vin.fill('1M8GDM9AXKP0427O8')
  await expect(page.getByText('never contains the letters I, O or Q')).toBeVisible()
  await vin.fill('1M8GDM9A5KP042788')
  await expect(page.getByText(/Check digit \(9th character\) is 5/)).toBeVisible()
  await expect(page.getByLabel('Keep this VIN because')).toBeVisible()
  await vin.fill('1M8GDM9AXKP042788')
  await expect(page.getByText('VIN checks out')).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/dispatch-new-errors-1280.png', fullPage: true })
  await page.getByRole('button', { name: 'Start over' }).click()
})

test('a second dispatcher sees a new call appear without reloading', async ({ browser }) => {
  const a = await browser.newContext({ viewport: DESK })
  const b = await browser.newContext({ viewport: DESK })
  const pa = await a.newPage(), pb = await b.newPage()
  await signIn(pa, 'dispatch@wayside.test')
  await signIn(pb, 'admin@wayside.test')
  await pb.goto('/dispatch?view=lanes')
  const customers = await (await pa.request.get('/api/customers?q=Lakeline')).json()
  const text = `Hydraulic leak at the plow, seen by both ${Date.now()}`
  const made = await pa.request.post('/api/calls', {
    headers: { 'x-wayside': '1' }, data: { customerId: customers.items[0].id, locationText: 'Civic Loop yard', complaint: text },
  })
  expect(made.status()).toBe(201)
  await expect(pb.getByText(text)).toBeVisible({ timeout: 20_000 })
  await a.close()
  await b.close()
})

test('a stale edit shows what the other person changed instead of overwriting it', async ({ browser }) => {
  const a = await browser.newContext({ viewport: DESK })
  const b = await browser.newContext({ viewport: DESK })
  const pa = await a.newPage(), pb = await b.newPage()
  await signIn(pa, 'dispatch@wayside.test')
  await signIn(pb, 'admin@wayside.test')
  const customers = await (await pa.request.get('/api/customers?q=Ironwood')).json()
  const made = await (await pa.request.post('/api/calls', {
    headers: { 'x-wayside': '1' },
    data: { customerId: customers.items[0].id, locationText: 'Terminal gate', complaint: 'Marker lamps out', poNumber: 'IFL-1' },
  })).json()
  for (const p of [pa, pb]) {
    await p.goto(`/calls/${made.id}`)
    await p.getByRole('button', { name: 'Edit' }).click()
  }
  await pa.getByLabel('PO number').fill('IFL-2')
  await pa.getByRole('button', { name: 'Save changes' }).click()
  await expect(pa.getByText('PO IFL-2')).toBeVisible()
  await pb.getByLabel('PO number').fill('IFL-3')
  await pb.getByRole('button', { name: 'Save changes' }).click()
  const notice = pb.getByRole('alert').filter({ hasText: 'Someone else saved this call' })
  await expect(notice).toBeVisible()
  await expect(notice.getByRole('row', { name: /PO number IFL-2 IFL-3/ })).toBeVisible()
  await pb.getByRole('button', { name: 'Drop mine, take theirs' }).click()
  await expect(pb.getByLabel('PO number')).toHaveValue('IFL-2')
  const now = await (await pa.request.get(`/api/calls/${made.id}`)).json()
  expect(now.poNumber).toBe('IFL-2')
  await a.close()
  await b.close()
})

test('screenshots of the dispatch screens at 1280×800', async ({ page }) => {
  await page.setViewportSize(DESK)
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/dispatch')
  await expect(page.getByRole('heading', { name: 'Dispatch' })).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/dispatch-1280.png' })
  await page.goto('/dispatch?view=lanes')
  await expect(page.getByRole('region', { name: /Waiting for a mechanic/ })).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/dispatch-lanes-1280.png' })
  await page.goto('/dispatch/new')
  await page.getByRole('button', { name: 'Start over' }).click()
  await page.screenshot({ path: 'tests/e2e/screenshots/dispatch-new-1280.png' })

  // A finished call with the whole record, and the unit with a comeback.
  await page.goto(`/calls/${seedId('call:c6')}`)
  await expect(page.getByText('J. Amundsen')).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/call-1280.png', fullPage: true })
  await page.goto(`/units/${seedId('unit:2')}`)
  await expect(page.getByText(/comeback/i).first()).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/unit-1280.png', fullPage: true })
})

test('a customer and a unit are added through their forms, the VIN checked on the way', async ({ page }) => {
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/customers')
  await page.getByRole('button', { name: 'Add customer' }).click()
  const name = `Millrace Grain ${Date.now()}`
  await page.getByLabel('Customer name').fill(name)
  await page.getByLabel('Billing terms').selectOption('account')
  await page.getByRole('button', { name: 'Add customer', exact: true }).last().click()
  await expect(page.getByText('An account customer needs net days')).toBeVisible()
  await page.getByLabel('Net days').fill('30')
  await page.getByLabel('Billing e-mail').fill('ap@millrace-grain.example')
  await page.locator('form').getByRole('button', { name: 'Add customer' }).click()
  await expect(page.getByRole('heading', { level: 1, name })).toBeVisible()
  await expect(page.getByText('On account, net 30 days')).toBeVisible()

  await page.getByRole('button', { name: 'Add unit' }).click()
  await page.getByLabel('Unit number').fill('MG-1')
  await page.getByLabel('VIN', { exact: true }).fill('1M8GDM9A5KP042788')
  await page.getByRole('button', { name: 'Add unit', exact: true }).last().click()
  await expect(page.getByText('Read the VIN again, or say why it is right as it is.')).toBeVisible()
  await page.getByLabel('Keep this VIN because').fill('Stamped so on the frame rail')
  await page.locator('form').getByRole('button', { name: 'Add unit' }).click()
  await expect(page.getByRole('link', { name: 'MG-1' })).toBeVisible()
  await page.getByRole('link', { name: 'MG-1' }).click()
  await expect(page.getByText('kept because: Stamped so on the frame rail')).toBeVisible()
})

test('an admin sets the average road speed behind drive times', async ({ page }) => {
  await signIn(page, 'admin@wayside.test')
  await page.goto('/setup')
  await page.getByRole('link', { name: 'Rates' }).click()
  const speed = page.getByLabel('Average road speed (km/h), for drive times')
  const before = await speed.inputValue()
  await speed.fill('0')
  await page.getByRole('button', { name: 'Save rates' }).click()
  await expect(page.getByText('Average road speed cannot be below 5')).toBeVisible()
  await speed.fill('65')
  await page.getByRole('button', { name: 'Save rates' }).click()
  await expect(page.getByText('New rates are in force from now.')).toBeVisible()
  const { rates } = await (await page.request.get('/api/rates')).json()
  expect(rates.averageRoadKph).toBe(65)
  await speed.fill(before)
  await page.getByRole('button', { name: 'Save rates' }).click()
  await expect(page.getByText('New rates are in force from now.')).toBeVisible()
})

test('the office settles a change made on a phone and in the office from the same start', async ({ page }) => {
  await signIn(page, 'dispatch@wayside.test')
  // A call of this test's own, so no phone test meets its conflict.
  const customers = await (await page.request.get('/api/customers?q=Bluestem')).json()
  const made = await page.request.post('/api/calls', {
    headers: { 'x-wayside': '1' }, data: { customerId: customers.items[0].id, locationText: 'Quarry gate', complaint: 'Gauge reads cold' },
  })
  const callId = (await made.json()).id as string
  await testPool().query('UPDATE calls SET story_cause = \'Thermostat stuck open\' WHERE id = $1', [callId])
  const call = { story_cause: 'Thermostat stuck open' }
  // As sync-server records one: the phone's value, the record's value, and what both started from.
  const { rows: [conflict] } = await testPool().query(
    `INSERT INTO conflicts (call_id, entity, entity_id, field, base_value, device_value, server_value, reason, raised_by)
     VALUES ($1, 'call', $1, 'storyCause', $2, $3, $4, 'storyCause: changed on the server since the device saw it', $5) RETURNING id`,
    [
      callId, JSON.stringify(call.story_cause), JSON.stringify('Coolant sensor connector pin pushed back'),
      JSON.stringify(call.story_cause), seedId('user:mech1'),
    ],
  )
  await page.goto(`/calls/${callId}`)
  const region = page.getByRole('region', { name: /Changes to settle/ })
  await expect(region).toContainText('1 open')
  await expect(region.getByText('Coolant sensor connector pin pushed back')).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/call-conflict-1280.png' })
  await region.getByLabel('Or write another value').fill('Connector pin 2 pushed back; re-pinned')
  await region.getByRole('button', { name: 'Use this value' }).click()
  await expect(page.getByRole('region', { name: /Changes to settle/ })).toContainText('0 open')
  await expect(page.getByRole('region', { name: 'Story' }).getByText('Connector pin 2 pushed back; re-pinned')).toBeVisible()
  const { rows: [after] } = await testPool().query('SELECT status, choice FROM conflicts WHERE id = $1', [conflict.id])
  expect(after).toEqual({ status: 'resolved', choice: 'value' })
})

test('work sent for a billed call is named in words, and only keeping the billed record settles it', async ({ page }) => {
  await signIn(page, 'dispatch@wayside.test')
  const callId = randomUUID()
  await testPool().query(
    `INSERT INTO calls (id, status, outcome, customer_id, location_text, complaint, mechanic_id, invoiced_at)
     VALUES ($1, 'invoiced', 'repaired', $2, 'Quarry gate', 'Gauge reads cold', $3, now())`,
    [callId, seedId('customer:bluestem'), seedId('user:mech1')],
  )
  // As the applier keeps it: the part line the phone sent, no value in the record.
  const sent = { callId, partNumber: 'CTS-100', description: 'Coolant temperature sensor', quantity: 1 }
  await testPool().query(
    `INSERT INTO conflicts (call_id, entity, entity_id, field, device_value, server_value, reason, raised_by)
     VALUES ($1, 'partLine', $2, 'callId', $3, 'null', $4, $5)`,
    [callId, randomUUID(), JSON.stringify(sent),
      'callId: the call is invoiced; the part line is kept for the office to add to a credit note or a follow-up call',
      seedId('user:mech1')],
  )
  await page.goto(`/calls/${callId}`)
  const region = page.getByRole('region', { name: /Changes to settle/ })
  await expect(region).toContainText('1 open')
  await expect(region).toContainText('Part line sent after billing: Part CTS-100 × 1')
  await expect(region.getByRole('button', { name: 'Keep the phone\'s' })).toHaveCount(0)
  await expect(region.getByLabel('Or write another value')).toHaveCount(0)
  await page.screenshot({ path: 'tests/e2e/screenshots/call-billed-conflict-1280.png' })
  await region.getByRole('button', { name: 'Keep the billed record' }).click()
  await expect(page.getByRole('region', { name: /Changes to settle/ })).toContainText('0 open')
})
