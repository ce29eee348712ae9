import type { Page } from '@playwright/test'
import { expect } from '@playwright/test'

export const PASSWORD = 'wayside-demo'
export const PHONE = { width: 360, height: 740 }

export async function signIn(page: Page, email: string) {
  await page.goto('/login')
  await page.getByLabel('E-mail').fill(email)
  await page.getByLabel('Password').fill(PASSWORD)
  await page.getByRole('button', { name: 'Sign in' }).click()
  await expect(page).not.toHaveURL(/\/login/)
}

/** Waits until the service worker controls the page, so going offline is answered by it. */
export async function waitForServiceWorker(page: Page) {
  // A sync predicate: an async one returns a Promise, which counts as truthy at once.
  await page.waitForFunction(() => !!navigator.serviceWorker?.controller, undefined, { timeout: 30_000 })
}

/** The mechanic signed in on the phone, the service worker in control and the first sync done. */
export async function signInSynced(page: Page, email: string) {
  await signIn(page, email)
  await waitForServiceWorker(page)
  await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Sync' }).click()
  await expect(page.getByTestId('last-sync')).not.toHaveText('never', { timeout: 30_000 })
}

/** A zigzag stroke across a signature pad, drawn with the mouse. */
export async function drawSignature(page: Page, testId: string) {
  const pad = page.getByTestId(testId)
  // In the middle of the screen: the bar fixed at the bottom of the phone's page would take the strokes.
  await pad.evaluate(el => el.scrollIntoView({ block: 'center' }))
  const box = (await pad.boundingBox())!
  await page.mouse.move(box.x + 20, box.y + box.height / 2)
  await page.mouse.down()
  for (let i = 1; i <= 10; i++) await page.mouse.move(box.x + 20 + i * 24, box.y + box.height / 2 + (i % 2 ? -25 : 25), { steps: 3 })
  await page.mouse.up()
}
