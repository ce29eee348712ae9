// VINs and part numbers from the camera. Chromium is started with a fake camera that plays a
// barcode picture (made here with bwip-js, photographed by the browser as JPEG frames and joined
// into an MJPEG file), so the unit form and the phone's part form read it as a person's camera would.
// Each test launches its own browser with those flags; the other specs keep the ordinary one.
import { mkdirSync, writeFileSync } from 'node:fs'
import { resolve } from 'node:path'
import bwipjs from 'bwip-js'
import { chromium, expect, test, type Browser, type LaunchOptions } from '@playwright/test'
import { seedId } from '../../server/db/seed/ids'
import { withCheckDigit } from '../support/vinReference'
import { PHONE, signIn, waitForServiceWorker } from './helpers'

const BASE_URL = process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3100'
const CALL_5 = seedId('call:c5') // at the truck, mech2, served from Truck 12 (server/db/seed/core.ts)
// Invented VINs (no real vehicle); the 9th character is the check digit of 49 CFR 565.15(c),
// computed by the independent implementation in tests/support/vinReference.ts.
const VIN_CODE39 = withCheckDigit('3WRDS7AC0TB412086')
const VIN_MATRIX = withCheckDigit('1WYSD4KT0SF230517')

/** A barcode on a white 640×480 label, as the JPEG frames of an MJPEG fake camera. */
async function fakeCameraFile(browser: Browser, name: string, bcid: string, text: string) {
  const bars = bcid === 'datamatrix' ? {} : { height: 18, includetext: true, textxalign: 'center' as const }
  const svg = bwipjs.toSVG({ bcid, text, scale: 3, ...bars, paddingwidth: 6, paddingheight: 6, backgroundcolor: 'FFFFFF' })
  const page = await browser.newPage({ viewport: { width: 640, height: 480 } })
  await page.setContent(`<body style="margin:0;width:640px;height:480px;display:flex;align-items:center;justify-content:center;
    background:#fff"><div style="width:${bcid === 'datamatrix' ? 260 : 600}px">${svg.replace('<svg ', '<svg width="100%" ')}</div></body>`)
  const frame = await page.screenshot({ type: 'jpeg', quality: 92 })
  await page.close()
  mkdirSync('test-results', { recursive: true })
  const file = resolve('test-results', `${name}.mjpeg`)
  // Chromium plays an MJPEG file as one frame per JPEG, over and over.
  writeFileSync(file, Buffer.concat(Array.from({ length: 30 }, () => frame)))
  writeFileSync(resolve('tests/e2e/screenshots', `${name}-label.jpg`), frame)
  return file
}

async function withCamera(file: string) {
  const base = test.info().project.use.launchOptions as LaunchOptions
  return chromium.launch({
    ...base,
    args: [...(base.args ?? []), '--use-fake-device-for-media-stream', '--use-fake-ui-for-media-stream',
      `--use-file-for-fake-video-capture=${file}`],
  })
}

test('a VIN scanned from a Code 39 label lands in the new unit form and checks out', async ({ browser }) => {
  const cam = await withCamera(await fakeCameraFile(browser, 'vin-code39', 'code39', VIN_CODE39))
  const ctx = await cam.newContext({ baseURL: BASE_URL, viewport: { width: 1280, height: 900 }, permissions: ['camera'] })
  const page = await ctx.newPage()
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/units')
  await page.getByRole('button', { name: 'Add unit' }).click()
  const vin = page.getByLabel('VIN', { exact: true })
  await expect(vin).toHaveValue('')
  await page.getByRole('button', { name: 'Scan the VIN' }).click()
  await expect(vin).toHaveValue(VIN_CODE39, { timeout: 30_000 })
  await expect(page.getByText('VIN checks out (check digit matches)')).toBeVisible()
  await expect(page.getByTestId('scan-status')).toHaveText(`Read from the barcode: ${VIN_CODE39}`)
  await expect(vin).toHaveAttribute('aria-invalid', 'false')
  // The camera is off once the VIN was read.
  await expect(page.getByRole('button', { name: 'Stop the camera' })).toBeHidden()
  await page.screenshot({ path: 'tests/e2e/screenshots/scan-vin-code39.png', fullPage: true })
  await cam.close()
})

test('a VIN in a Data Matrix label, scanned on a phone-sized screen, fills the unit form', async ({ browser }) => {
  const cam = await withCamera(await fakeCameraFile(browser, 'vin-datamatrix', 'datamatrix', VIN_MATRIX))
  const ctx = await cam.newContext({ baseURL: BASE_URL, viewport: PHONE, isMobile: true, hasTouch: true, permissions: ['camera'] })
  const page = await ctx.newPage()
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/units')
  await page.getByRole('button', { name: 'Add unit' }).click()
  await page.getByRole('button', { name: 'Scan the VIN' }).click()
  const vin = page.getByLabel('VIN', { exact: true })
  await expect(vin).toHaveValue(VIN_MATRIX, { timeout: 30_000 })
  await expect(page.getByText('VIN checks out (check digit matches)')).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/scan-vin-datamatrix-360.png', fullPage: true })
  await cam.close()
})

test('the mechanic scans a part\'s label and the truck\'s stock line is picked', async ({ browser }) => {
  const cam = await withCamera(await fakeCameraFile(browser, 'part-code128', 'code128', 'TR-CONN-6'))
  const ctx = await cam.newContext({ baseURL: BASE_URL, viewport: PHONE, isMobile: true, hasTouch: true, permissions: ['camera'] })
  const page = await ctx.newPage()
  await signIn(page, 'mech2@wayside.test')
  await waitForServiceWorker(page)
  await page.goto('/m/sync')
  await expect(page.getByTestId('last-sync')).not.toHaveText('never', { timeout: 30_000 })
  await page.goto(`/m/calls/${CALL_5}`)
  await page.getByRole('button', { name: 'Add a part' }).click()
  await page.getByRole('button', { name: 'Scan the part number' }).click()
  await expect(page.getByLabel('Part number')).toHaveValue('TR-CONN-6', { timeout: 30_000 })
  await expect(page.getByLabel('Description')).toHaveValue('Connector repair kit, 6-way sealed')
  await expect(page.getByLabel('From the truck\'s stock')).not.toHaveValue('')
  await page.screenshot({ path: 'tests/e2e/screenshots/scan-part-360.png', fullPage: true })
  await cam.close()
})

test('at the truck the mechanic checks the VIN label against the unit on file and notes the difference', async ({ browser }) => {
  const cam = await withCamera(await fakeCameraFile(browser, 'vin-truck', 'datamatrix', VIN_MATRIX))
  const ctx = await cam.newContext({ baseURL: BASE_URL, viewport: PHONE, isMobile: true, hasTouch: true, permissions: ['camera'] })
  const page = await ctx.newPage()
  await signIn(page, 'mech2@wayside.test')
  await waitForServiceWorker(page)
  await page.goto('/m/sync')
  await expect(page.getByTestId('last-sync')).not.toHaveText('never', { timeout: 30_000 })
  await page.goto(`/m/calls/${CALL_5}`)
  await page.getByRole('button', { name: 'Check the VIN' }).click()
  // Unit 4 has another VIN on file (server/db/seed/core.ts): the phone says so and checks the scanned one.
  await expect(page.getByTestId('vin-check')).toContainText('Differs from the VIN on file', { timeout: 30_000 })
  await expect(page.getByTestId('vin-check')).toContainText('It checks out (check digit matches)')
  await page.getByRole('button', { name: 'Add the scanned VIN to the call\'s notes' }).click()
  await expect(page.getByText(`VIN read from the unit's label at the truck: ${VIN_MATRIX}`)).toBeVisible()
  await page.screenshot({ path: 'tests/e2e/screenshots/scan-vin-at-truck-360.png' })
  await cam.close()
})

test('with no camera allowed the form says so and typing still works', async ({ page }) => {
  // The ordinary test browser has no camera and grants none.
  await signIn(page, 'dispatch@wayside.test')
  await page.goto('/units')
  await page.getByRole('button', { name: 'Add unit' }).click()
  await page.getByRole('button', { name: 'Scan the VIN' }).click()
  await expect(page.getByRole('alert').filter({ hasText: 'Type it in instead' })).toBeVisible()
  const vin = page.getByLabel('VIN', { exact: true })
  await vin.fill(VIN_CODE39)
  await expect(page.getByText('VIN checks out (check digit matches)')).toBeVisible()
})
