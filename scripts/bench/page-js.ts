// JavaScript a page really loads, gzipped: Chromium (Debian's) opens the phone's home /m and then
// a call page on a 360 px screen as mech1, and the dispatch board as the dispatcher, with the
// service worker kept out (its precache would fetch every chunk). Each JavaScript file the page
// requested counts once, at the size of its precompressed `.gz` in the built .output/public (what
// the server sends), or gzipped here when the build left none. Beside it, the routes' own share
// from the build manifest: the entry, the layout and the pages with everything they import
// statically (the rest is what Nuxt preloads for links on screen). Prints; asserts nothing.
import { existsSync, readFileSync, statSync } from 'node:fs'
import { join } from 'node:path'
import { pathToFileURL } from 'node:url'
import { gzipSync } from 'node:zlib'
import { chromium, type BrowserContext, type Page } from '@playwright/test'
import { recordRow } from './support/rows'
import { BASE, sessionCookie } from './support/session'

const PUBLIC = join(process.cwd(), '.output', 'public')
const MANIFEST = join(process.cwd(), '.output', 'server', 'chunks', 'build', 'client.precomputed.mjs')

type Manifest = { dependencies: Record<string, { preload: Record<string, { file: string }> }>, entrypoints: string[] }

/**
 * A page's key in the manifest. A page whose chunk the bundler shares with the parts it loads later
 * (its own components, made lazy) has no key of its own: then the chunk the router loads for its
 * path, read from the route table in the built entry.
 */
function pageKey(m: Manifest, src: string, route?: string): string {
  if (m.dependencies[src] || !route) return src
  const entry = m.entrypoints[0]!
  const file = m.dependencies[entry]?.preload[entry]?.file
  const js = file ? readFileSync(join(PUBLIC, '_nuxt', file), 'utf8') : ''
  const at = js.indexOf(`path:${JSON.stringify(route)}`)
  const chunk = at >= 0 ? /import\("\.\/([\w-]+\.js)"\)/.exec(js.slice(at, at + 400))?.[1] : undefined
  return chunk ? `_${chunk}` : src
}

/** The JavaScript files the build says these sources (a route's path beside a page) load up front, with the entry. */
async function ownFiles(sources: (string | { src: string, route: string })[]): Promise<Set<string>> {
  const m = (await import(pathToFileURL(MANIFEST).href) as { default: Manifest }).default
  const out = new Set<string>()
  const keys = sources.map(s => (typeof s === 'string' ? s : pageKey(m, s.src, s.route)))
  for (const src of [...m.entrypoints, ...keys]) {
    const deps = m.dependencies[src]
    if (!deps) throw new Error(`the build manifest has no ${src}`)
    for (const d of Object.values(deps.preload)) if (d.file.endsWith('.js')) out.add(`/_nuxt/${d.file}`)
  }
  return out
}

const sumOf = (m: Map<string, number>, only?: Set<string>) => [...m].filter(([p]) => !only || only.has(p)).reduce((a, [, b]) => a + b, 0)

function gzippedBytes(path: string, body: Buffer | null): number {
  const gz = join(PUBLIC, `${path}.gz`)
  if (existsSync(gz)) return statSync(gz).size
  const file = join(PUBLIC, path)
  const raw = existsSync(file) ? readFileSync(file) : body
  return raw ? gzipSync(raw, { level: 9 }).length : 0
}

/** Every same-origin .js the page asks for while `visit` runs, with its gzipped size. */
async function scriptsOf(ctx: BrowserContext, visit: (page: Page) => Promise<void>) {
  const page = await ctx.newPage()
  const seen = new Map<string, number>()
  const pending: Promise<void>[] = []
  page.on('response', (res) => {
    const url = new URL(res.url())
    if (url.origin !== new URL(BASE).origin || !/\.m?js$/.test(url.pathname) || seen.has(url.pathname)) return
    seen.set(url.pathname, 0)
    pending.push(res.body().catch(() => null).then((b) => {
      seen.set(url.pathname, gzippedBytes(url.pathname, b))
    }))
  })
  await visit(page)
  // Chunks Nuxt preloads for links on screen arrive once the page is idle: they count, the page fetched them.
  await page.waitForLoadState('networkidle')
  await page.waitForTimeout(1500)
  await Promise.all(pending)
  await page.close()
  return seen
}

async function signedInContext(email: string, phone: boolean) {
  const browser = await chromium.launch({
    executablePath: process.env.WAYSIDE_CHROMIUM ?? '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'],
  })
  const ctx = await browser.newContext({
    baseURL: BASE, serviceWorkers: 'block',
    ...(phone ? { viewport: { width: 360, height: 740 }, isMobile: true, hasTouch: true } : { viewport: { width: 1366, height: 900 } }),
  })
  const [name, value] = (await sessionCookie(email)).split(/=(.*)/s) as [string, string]
  await ctx.addCookies([{ name, value, url: BASE }])
  return { browser, ctx }
}

const kb = (bytes: number) => Math.round(bytes / 102.4) / 10
const list = (m: Map<string, number>) => [...m].sort((a, b) => b[1] - a[1]).map(([p, b]) => `${p.split('/').pop()} ${kb(b)}`).join(', ')

const mech = await signedInContext('mech1@wayside.test', true)
try {
  const scripts = await scriptsOf(mech.ctx, async (page) => {
    await page.goto('/m')
    const first = page.getByRole('list', { name: 'Open calls' }).getByRole('link').first()
    await first.waitFor({ timeout: 30_000 })
    await first.click()
    await page.waitForURL(/\/m\/calls\/[0-9a-f-]{36}/, { timeout: 30_000 })
  })
  const total = sumOf(scripts)
  const own = sumOf(scripts, await ownFiles([
    'layouts/field.vue', 'pages/m/index.vue', { src: 'pages/m/calls/[id]/index.vue', route: '/m/calls/:id()' },
  ]))
  console.log(`mechanic /m then a call page: ${scripts.size} JavaScript files, ${kb(total)} KB gzipped: ${list(scripts)}`)
  recordRow({
    name: 'mechanic-js', value: kb(own), unit: 'KB', floor: null, target: '≤ 120',
    note: `the entry, layout and /m and call page's own imports, gzipped as served (360 px, no service worker); `
      + `with what Nuxt preloads for links on screen ${kb(total)} KB in ${scripts.size} files`,
  })
}
finally {
  await mech.browser.close()
}

const desk = await signedInContext('dispatch@wayside.test', false)
try {
  const scripts = await scriptsOf(desk.ctx, async (page) => {
    await page.goto('/dispatch')
    await page.getByRole('heading', { level: 1 }).first().waitFor({ timeout: 30_000 })
  })
  const total = sumOf(scripts)
  const own = sumOf(scripts, await ownFiles(['layouts/default.vue', 'pages/dispatch/index.vue']))
  console.log(`dispatch board /dispatch: ${scripts.size} JavaScript files, ${kb(total)} KB gzipped: ${list(scripts)}`)
  recordRow({
    name: 'dispatch-js', value: kb(own), unit: 'KB', floor: null, target: '≤ 250',
    note: `the entry, layout and /dispatch's own imports, gzipped as served (1366 px, no service worker); `
      + `with what Nuxt preloads for links on screen ${kb(total)} KB in ${scripts.size} files`,
  })
}
finally {
  await desk.browser.close()
}
