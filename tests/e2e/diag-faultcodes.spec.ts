// The call's one fault-code form on a 360 px phone: codes typed and decoded live; the list on the
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

test('one fault-code form on the call: typed codes decoded live, the returned flag on the call\'s list', async ({ browser }) => {
  const ctx = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true })
  const call = await makeCall()
  const page = await ctx.newPage()
  await openCall(page, call)
  const codes = page.getByRole('region', { name: /Fault codes/ })
  const seeded = codes.getByRole('article', { name: 'Fault code SPN 3242 FMI 4' }).first()
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
