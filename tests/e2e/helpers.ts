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
