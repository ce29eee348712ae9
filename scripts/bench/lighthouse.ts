// Lighthouse 12's mobile performance score (its default: a mid-range phone, simulated slow 4G and
// CPU) for the phone's home /m as mech1 and the dispatch board as the dispatcher, signed in by
// sending the session cookie with every request. Debian's Chromium through chrome-launcher
// (CHROME_PATH). One run per page (about a minute each on this machine); set
// WAYSIDE_BENCH_LIGHTHOUSE_RUNS for the median of more. Prints; asserts nothing.
import * as chromeLauncher from 'chrome-launcher'
import lighthouse from 'lighthouse'
import { recordRow } from './support/rows'
import { BASE, median, sessionCookie } from './support/session'

const RUNS = Number(process.env.WAYSIDE_BENCH_LIGHTHOUSE_RUNS ?? 1)
const CHROME = process.env.CHROME_PATH ?? '/usr/bin/chromium'

type Audit = { score: number, fcp: number, lcp: number, tbt: number, bytes: number }

async function audit(path: string, cookie: string): Promise<Audit> {
  const chrome = await chromeLauncher.launch({ chromePath: CHROME, chromeFlags: ['--headless=new', '--no-sandbox', '--disable-gpu'] })
  try {
    const result = await lighthouse(`${BASE}${path}`, {
      port: chrome.port, output: 'json', logLevel: 'error', onlyCategories: ['performance'], extraHeaders: { Cookie: cookie },
    })
    if (!result) throw new Error(`Lighthouse gave no result for ${path}`)
    const { lhr } = result
    if (lhr.runtimeError) throw new Error(`Lighthouse on ${path}: ${lhr.runtimeError.message}`)
    // A page that sent the browser to sign in would score the sign-in page instead.
    if (new URL(lhr.finalDisplayedUrl).pathname !== path) throw new Error(`Lighthouse ended on ${lhr.finalDisplayedUrl}, not ${path}`)
    const num = (id: string) => Number(lhr.audits[id]?.numericValue ?? Number.NaN)
    return {
      score: Math.round((lhr.categories.performance?.score ?? 0) * 100),
      fcp: num('first-contentful-paint'), lcp: num('largest-contentful-paint'), tbt: num('total-blocking-time'),
      bytes: num('total-byte-weight'),
    }
  }
  finally {
    chrome.kill()
  }
}

async function scoreOf(name: string, path: string, email: string) {
  const cookie = await sessionCookie(email)
  const runs: Audit[] = []
  for (let i = 0; i < RUNS; i++) runs.push(await audit(path, cookie))
  const mid = runs.find(r => r.score === median(runs.map(x => x.score)))!
  const ms = (n: number) => `${(n / 1000).toFixed(1)} s`
  const detail = `first paint ${ms(mid.fcp)}, largest paint ${ms(mid.lcp)}, blocking ${mid.tbt.toFixed(0)} ms, `
    + `${(mid.bytes / 1024).toFixed(0)} KB transferred`
  console.log(`${name} ${path}: scores ${runs.map(r => r.score).join(', ')}; median run: ${detail}`)
  recordRow({
    name, value: mid.score, unit: 'points', floor: null, target: '≥ 90',
    note: `Lighthouse ${path} as ${email}, mobile defaults, median of ${runs.length} (${detail})`,
  })
}

await scoreOf('lighthouse-mechanic', '/m', 'mech1@wayside.test')
await scoreOf('lighthouse-dispatch', '/dispatch', 'dispatch@wayside.test')
