// Fault codes as the truck sends them, on a 360 px phone: the bytes of a scan tool's raw DM1 view
// pasted into the call's one fault-code form, read per J1939-73, and recorded; the list on the
// call shows each code decoded, with the "returned" flag.
import { randomUUID } from 'node:crypto'
import { expect, test, type Page } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { testPool } from '../support/db'
import { PHONE, signIn } from './helpers'

/** A call of the test's own at the truck with mech2, holding SPN 3242 FMI 4, so no demo call changes. */
async function makeCall() {
  const id = randomUUID()
  const { rows } = await testPool().query(
    `INSERT INTO calls (id, status, customer_id, unit_id, location_text, complaint, mechanic_id, assigned_at, on_site_at)
     VALUES ($1, 'on_site', $2, $3, 'County Road 4 shoulder, by the grain elevator', 'Check-engine lamp, engine derated', $4, now(), now())
     RETURNING number`,
    [id, seedId('customer:ironwood'), seedId('unit:4'), seedId('user:mech2')],
  )
  await testPool().query(`INSERT INTO fault_codes (call_id, spn, fmi, state, count) VALUES ($1, 3242, 4, 'active', 5)`, [id])
  return { id, number: rows[0].number as number }
}

async function openCall(page: Page, call: { id: string, number: number }) {
  await signIn(page, 'mech2@wayside.test')
  await expect(page.getByRole('list', { name: 'Open calls' }).getByRole('link', { name: new RegExp(`#${call.number}\\b`) })).toBeVisible()
  await page.goto(`/m/calls/${call.id}`)
}

test('a DM1 message pasted on the phone becomes the call\'s fault codes', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const call = await makeCall()
  const page = await ctx.newPage()
  await openCall(page, call)
  const codes = page.getByRole('region', { name: /Fault codes/ })
  await expect(codes.getByRole('article', { name: 'Fault code SPN 3242 FMI 4' })).toBeVisible()
  await codes.getByRole('button', { name: 'Add a fault code' }).click()
  await codes.getByRole('radio', { name: 'DM1 bytes' }).click()
  const bytes = codes.getByLabel('Bytes from the scan tool\'s raw DM1 view')

  // A code cut short is refused, naming where.
  await bytes.fill('04 FF 64 00 01')
  await expect(codes.getByRole('alert')).toContainText('cut short')
  await expect(codes.getByRole('button', { name: 'Add the codes' })).toBeDisabled()
  // Bytes that are not hex are refused, naming the field and the piece.
  await bytes.fill('04 FF 6Z 00')
  await expect(codes.getByRole('alert')).toContainText('DM1 bytes: "6Z" is not a hex byte')
  await expect(codes.getByRole('button', { name: 'Add the codes' })).toBeDisabled()

  // REFERENCES §4 (J1939-73 DM1): lamp byte 0x04 = amber warning on (bits 4–3 are 01); SPN 100 FMI 1 OC 1 = 64 00 01 01;
  // SPN 3226 FMI 4 OC 2 = 9A 0C 04 02; FF FF FF FF is filler, not a code
  await bytes.fill('0x04, 0xFF, 0x64, 0x00, 0x01, 0x01, 0x9A, 0x0C, 0x04, 0x02, 0xFF, 0xFF, 0xFF, 0xFF')
  const decoded = codes.getByTestId('dm1-decoded')
  await expect(decoded).toContainText('Lamps on: amber warning lamp')
  await expect(decoded.getByRole('list', { name: 'Codes in the message' }).getByRole('listitem')).toHaveCount(2)
  await expect(decoded).toContainText('SPN 100 FMI 1')
  await expect(decoded).toContainText('SPN 3226 FMI 4')
  await page.getByRole('region', { name: /Fault codes/ }).screenshot({ path: 'tests/e2e/screenshots/diag-dm1-paste-360.png' })
  await codes.getByRole('button', { name: 'Add 2 codes from the truck' }).click()
  await expect(codes.getByRole('status')).toContainText('2 codes added to the call')
  const list = codes.getByRole('list', { name: 'Fault codes recorded' })
  await expect(list.getByRole('article', { name: 'Fault code SPN 100 FMI 1' })).toBeVisible()
  await expect(list.getByRole('article', { name: 'Fault code SPN 3226 FMI 4' })).toContainText('seen 2×')
  await codes.getByRole('button', { name: 'Done' }).click()
  await codes.screenshot({ path: 'tests/e2e/screenshots/diag-dm1-added-360.png' })

  // Synced as the truck sent them.
  await expect.poll(async () => (await testPool().query(
    `SELECT spn, fmi, count, source FROM fault_codes WHERE call_id = $1 AND source = 'dm1' ORDER BY spn`, [call.id],
  )).rows, { timeout: 30_000 }).toEqual([{ spn: 100, fmi: 1, count: 1, source: 'dm1' }, { spn: 3226, fmi: 4, count: 2, source: 'dm1' }])
  await ctx.close()
})

test('one fault-code form on the call: typed codes decoded live, the returned flag on the call\'s list', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const call = await makeCall()
  const page = await ctx.newPage()
  await openCall(page, call)
  const codes = page.getByRole('region', { name: /Fault codes/ })
  const seeded = codes.getByRole('article', { name: 'Fault code SPN 3242 FMI 4' }).first()
  // Marking a code cleared waits for the repair: record it first (the correction).
  await expect(seeded.getByTestId('clear-after-repair')).toContainText('comes after the repair')
  await expect(seeded.getByRole('button', { name: 'Mark cleared after the repair' })).toHaveCount(0)
  await page.getByLabel(/^Correction/).fill('Replaced the exhaust temperature sensor.')
  await page.getByRole('button', { name: 'Save the story' }).click()
  await seeded.getByRole('button', { name: 'Mark cleared after the repair' }).click()
  await expect(seeded).toContainText('Cleared')
  await codes.getByRole('button', { name: 'Add a fault code' }).click()
  // the form there is the only one: no second form on the call page
  await expect(page.getByRole('radiogroup', { name: 'Code form' })).toHaveCount(1)
  await codes.getByLabel('SPN', { exact: true }).fill('3242')
  await codes.getByLabel('FMI', { exact: true }).selectOption('4')
  // SAE J1939-73 FMI 4 (REFERENCES §4): voltage below normal or shorted low
  await expect(codes.getByTestId('fault-decoded')).toContainText('FMI')
  await codes.getByRole('button', { name: 'Add fault code' }).click()
  await expect(codes.getByRole('article', { name: 'Fault code SPN 3242 FMI 4' }).last()).toContainText('Returned: cleared')
  await ctx.close()
})
