// The database stopped and started under a running app: 503 with Retry-After meanwhile (never a
// 500), the health route says so for the load balancer, and everything works again after, the
// phone's resent push included. The test runs a PostgreSQL cluster of its own (so the slot's
// test database and everyone else's cluster are never touched) and an app process on its own port.
import { execFileSync } from 'node:child_process'
import { existsSync, mkdirSync, rmSync, writeFileSync, appendFileSync } from 'node:fs'
import { fileURLToPath } from 'node:url'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import { randomUUID } from 'node:crypto'
import { ApiClient } from '../support/api'
import { DEMO } from '../support/env'
import { ownServerPort, startOwnServer, type OwnServer } from '../support/server'

const ROOT = fileURLToPath(new URL('../..', import.meta.url))
const BIN = process.env.WAYSIDE_PG_BIN ?? '/usr/lib/postgresql/15/bin'
const SLOT = process.env.WAYSIDE_TEST_SLOT ?? '0'
const PORT = Number(process.env.WAYSIDE_PG_PORT ?? 54329) + 100
const DIR = `${ROOT}.data/pg-outage-${SLOT}`
const URL_ = `postgres://wayside@127.0.0.1:${PORT}/wayside_outage`
const asRoot = process.getuid?.() === 0

/** Runs a PostgreSQL tool as the cluster's owner (initdb and postgres refuse root). */
function pg(tool: string, args: string[]) {
  const cmd = asRoot ? ['runuser', ['-u', 'postgres', '--', `${BIN}/${tool}`, ...args]] as const : [`${BIN}/${tool}`, args] as const
  return execFileSync(cmd[0], [...cmd[1]], { stdio: 'pipe', timeout: 60_000 }).toString()
}
const pgCtl = (action: 'start' | 'stop') =>
  pg('pg_ctl', ['-D', `${DIR}/data`, '-l', `${DIR}/log`, '-w', '-t', '60', ...(action === 'stop' ? ['-m', 'fast'] : []), action])

function stopQuietly() {
  try {
    pgCtl('stop')
  }
  catch { /* not running */ }
}

let server: OwnServer
let office: ApiClient

beforeAll(async () => {
  if (existsSync(`${DIR}/data/postmaster.pid`)) stopQuietly()
  rmSync(DIR, { recursive: true, force: true })
  mkdirSync(DIR, { recursive: true })
  if (asRoot) execFileSync('chown', ['postgres', DIR])
  pg('initdb', ['-D', `${DIR}/data`, '-U', 'wayside', '--auth=trust', '--encoding=UTF8', '--no-locale'])
  const conf = `\nlisten_addresses = '127.0.0.1'\nport = ${PORT}\nunix_socket_directories = '${DIR}'\nfsync = off\n`
  if (asRoot) execFileSync('runuser', ['-u', 'postgres', '--', 'sh', '-c', `cat >> '${DIR}/data/postgresql.conf'`], { input: conf })
  else appendFileSync(`${DIR}/data/postgresql.conf`, conf)
  if (!asRoot) writeFileSync(`${DIR}/log`, '')
  pgCtl('start')
  pg('createdb', ['-h', '127.0.0.1', '-p', String(PORT), '-U', 'wayside', 'wayside_outage'])
  const env = { ...process.env, NUXT_DATABASE_URL: URL_ }
  execFileSync('npx', ['tsx', 'server/db/migrate.ts'], { cwd: ROOT, env, stdio: 'pipe' })
  execFileSync('npx', ['tsx', 'server/db/seed/index.ts'], { cwd: ROOT, env, stdio: 'pipe' })
  server = await startOwnServer(ownServerPort(9), { NUXT_DATABASE_URL: URL_ })
  office = new ApiClient(server.url)
  await office.login(DEMO.office)
}, 240_000)

afterAll(async () => {
  await server?.kill('SIGTERM')
  stopQuietly()
  rmSync(DIR, { recursive: true, force: true })
})

async function until(what: string, test: () => Promise<boolean>, ms = 30_000) {
  const end = Date.now() + ms
  while (Date.now() < end) {
    if (await test()) return
    await new Promise(r => setTimeout(r, 250))
  }
  throw new Error(`timed out waiting for ${what}`)
}

describe('the database stopped and started while the app runs', () => {
  it('answers 503 with Retry-After meanwhile, and works again after, the phone\'s resent push included', async () => {
    expect((await fetch(`${server.url}/api/health`)).status).toBe(200)
    expect((await office.get('/api/calls')).status).toBe(200)
    const mech = new ApiClient(server.url)
    const me = await mech.login(DEMO.mech1)
    const calls = (await mech.get('/api/calls')).body.items as { id: string }[]
    expect(calls.length).toBeGreaterThan(0)
    const clientId = randomUUID()
    const note = { callId: calls[0]!.id, text: 'Written with no database up' }
    const op = { opId: randomUUID(), clientId, seq: 1, at: new Date().toISOString(), schemaVersion: 1 }
    const push = { clientId, ops: [{ ...op, entity: 'note', entityId: randomUUID(), action: 'create', changes: note }] }

    pgCtl('stop')
    const health = await fetch(`${server.url}/api/health`)
    expect(health.status).toBe(503)
    expect(Number(health.headers.get('retry-after'))).toBeGreaterThan(0)
    expect(await health.json()).toMatchObject({ ok: false, database: 'down' })

    const answers = [
      await office.get('/api/calls'),
      await new ApiClient(server.url).post('/api/auth/login', { email: DEMO.office, password: 'wayside-demo' }),
      await mech.post('/api/sync/push', push),
    ]
    for (const r of answers) {
      expect(r.status).toBe(503)
      expect(Number(r.headers.get('retry-after'))).toBeGreaterThan(0)
      expect(r.body.requestId).toBeTruthy()
      expect(r.body.message).toMatch(/database/)
    }

    pgCtl('start')
    await until('health to come back', async () => (await fetch(`${server.url}/api/health`)).status === 200)
    expect((await office.get('/api/calls')).status).toBe(200)
    const resent = await mech.post('/api/sync/push', push)
    expect(resent.status).toBe(200)
    expect(resent.body.results[0].status).toBe('applied')
    const record = await mech.get(`/api/calls/${calls[0]!.id}`)
    expect(record.body.notes.some((n: { text: string, authorId?: string }) => n.text === 'Written with no database up')).toBe(true)
    expect(me.role).toBe('mechanic')
    // Nothing in the server's log was a 500.
    expect(server.output()).not.toMatch(/"status":500/)
  }, 120_000)
})
