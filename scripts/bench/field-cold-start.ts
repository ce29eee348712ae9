// A cold start of the mechanic's home with no signal: the browser is started afresh on a profile
// that signed in once with signal, the network is cut, and the page is opened on a CPU slowed
// 4× (a mid-range phone). Timed until the first call card shows, beside a static file from the
// same server (a fresh browser, so the server answers, not the worker) with the same slowdown. Prints medians; asserts nothing.
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { chromium, type BrowserContext, type Page } from '@playwright/test'
import { recordRow } from './support/rows'

const BASE = process.env.WAYSIDE_BENCH_URL ?? process.env.WAYSIDE_TEST_URL ?? 'http://127.0.0.1:3190'
const RUNS = Number(process.env.WAYSIDE_BENCH_RUNS ?? 5)
const CPU_SLOWDOWN = 4
const ARGS = [
  '--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run',
  '--disable-background-networking', '--disable-component-update', '--disable-sync',
]
const profile = mkdtempSync(join(tmpdir(), 'wayside-bench-'))

function launch(dir = profile): Promise<BrowserContext> {
  return chromium.launchPersistentContext(dir, {
    executablePath: process.env.WAYSIDE_CHROMIUM ?? '/usr/bin/chromium', args: ARGS, baseURL: BASE,
    viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true,
  })
}

async function slow(page: Page) {
  const cdp = await page.context().newCDPSession(page)
  await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN })
}

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b)
  return s[Math.floor(s.length / 2)]!
}

try {
  // Once with signal: sign in, let the worker take over and the first sync fill IndexedDB.
  let ctx = await launch()
  let page = ctx.pages()[0] ?? await ctx.newPage()
  await page.goto('/login')
  await page.getByLabel('E-mail').fill('mech1@wayside.test')
  await page.getByLabel('Password').fill('wayside-demo')
  await page.getByRole('button', { name: 'Sign in' }).click()
  await page.waitForFunction(() => !!navigator.serviceWorker?.controller, undefined, { timeout: 30_000 })
  await page.getByRole('list', { name: 'Open calls' }).getByRole('link').first().waitFor({ timeout: 30_000 })
  await ctx.close()

  const cold: number[] = []
  const staticFile: number[] = []
  for (let i = 0; i < RUNS; i++) {
    ctx = await launch()
    await ctx.setOffline(true)
    page = ctx.pages()[0] ?? await ctx.newPage()
    await slow(page)
    const t0 = Date.now()
    await page.goto('/m')
    await page.getByRole('list', { name: 'Open calls' }).getByRole('link').first().waitFor({ timeout: 60_000 })
    cold.push(Date.now() - t0)
    await ctx.close()

    // A fresh profile, so no service worker answers: the server itself sends the static page.
    const bare = mkdtempSync(join(tmpdir(), 'wayside-bench-static-'))
    ctx = await launch(bare)
    page = ctx.pages()[0] ?? await ctx.newPage()
    await slow(page)
    const t1 = Date.now()
    await page.goto('/favicon.svg', { waitUntil: 'load' })
    staticFile.push(Date.now() - t1)
    await ctx.close()
    rmSync(bare, { recursive: true, force: true })
  }
  console.log(`cold offline start of /m to first call, CPU ${CPU_SLOWDOWN}× slower: `
    + `median ${median(cold)} ms (runs: ${cold.join(', ')} ms)`)
  console.log(`static page (/favicon.svg) from the same server, CPU ${CPU_SLOWDOWN}× slower: `
    + `median ${median(staticFile)} ms (runs: ${staticFile.join(', ')} ms)`)
  recordRow({
    name: 'offline-cold-start', value: median(cold), unit: 'ms', floor: median(staticFile), target: 'ratio ≤ 1.5',
    note: `offline /m to its first call vs /favicon.svg, CPU ${CPU_SLOWDOWN}× slower, median of ${cold.length}`,
  })
}
finally {
  rmSync(profile, { recursive: true, force: true })
}
