import { execFileSync } from 'node:child_process'
import { randomUUID } from 'node:crypto'
import { fileURLToPath } from 'node:url'
import { drizzle } from 'drizzle-orm/node-postgres'
import pg from 'pg'
import { afterAll, beforeAll, describe, expect, it } from 'vitest'
import * as schema from '../../server/db/schema'
import { SEED_CARDS, seedCards, seedPlan, seedVersionId } from '../../server/db/seed/cards'
import { seedId } from '../../server/db/seed/ids'
import { DATABASE_URL } from '../support/env'

// A database seeded by release 0.1 (tests/fixtures/release-0.1.sql) holds the first seeded cards.
// Seeding it again moves each seeded card to the new revision as a new version, adds the new
// cards, leaves a card an admin changed as the admin made it, and does nothing the second time.
const FIXTURE = fileURLToPath(new URL('../fixtures/release-0.1.sql', import.meta.url))
const scratchName = `wayside_cardseed_${process.pid}`
const adminUrl = DATABASE_URL.replace(/\/[^/]+$/, '/postgres')
const scratchUrl = DATABASE_URL.replace(/\/[^/]+$/, `/${scratchName}`)
const psql = `${process.env.WAYSIDE_PG_BIN ?? '/usr/bin'}/psql`

describe('seeding a database that already has the first seeded cards', () => {
  const admin = new pg.Client({ connectionString: adminUrl })
  let pool: pg.Pool
  beforeAll(async () => {
    await admin.connect()
    await admin.query(`DROP DATABASE IF EXISTS ${scratchName} WITH (FORCE)`)
    await admin.query(`CREATE DATABASE ${scratchName}`)
    execFileSync(psql, ['-q', '-v', 'ON_ERROR_STOP=1', '-d', scratchUrl, '-f', FIXTURE], { stdio: 'pipe' })
    execFileSync('npx', ['tsx', 'server/db/migrate.ts'], { env: { ...process.env, NUXT_DATABASE_URL: scratchUrl }, stdio: 'pipe' })
    pool = new pg.Pool({ connectionString: scratchUrl, max: 2 })
    // Dropping the scratch database at the end ends a connection that may still be closing.
    pool.on('error', () => {})
  }, 120_000)
  afterAll(async () => {
    await pool?.end()
    await admin.query(`DROP DATABASE IF EXISTS ${scratchName} WITH (FORCE)`)
    await admin.end()
  })

  const versions = async (slug: string) => (await pool.query(
    'SELECT v.id, v.card_version, v.definition, c.current_version FROM test_card_versions v JOIN test_cards c ON c.id = v.card_id '
    + 'WHERE c.slug = $1 ORDER BY v.card_version',
    [slug],
  )).rows

  it('adds the new revision as a new version, keeps the old one, and leaves an admin’s card alone', async () => {
    const egtBefore = await versions('egt-rtd-sensor')
    expect(egtBefore.map(v => v.card_version)).toEqual([1])
    expect(egtBefore[0].definition.codePatterns).toContain('SPN 3242 FMI *')
    // An admin changed the battery card after release 0.1.
    const battery = seedId('card:battery-charging')
    const edited = { ...egtBefore[0].definition, title: 'Batteries, as our shop does it' }
    await pool.query(
      'INSERT INTO test_card_versions (id, card_id, card_version, definition, author_id) VALUES ($1, $2, 2, $3, $4)',
      [randomUUID(), battery, edited, seedId('user:admin')],
    )
    await pool.query('UPDATE test_cards SET current_version = 2 WHERE id = $1', [battery])

    const log: string[] = []
    const db = drizzle(pool, { schema })
    await db.transaction(tx => seedCards(tx as unknown as typeof db, l => log.push(l)))

    const egt = await versions('egt-rtd-sensor')
    expect(egt.map(v => v.card_version)).toEqual([1, 2])
    expect(egt[0].definition.codePatterns).toContain('SPN 3242 FMI *') // the old version, as it was: runs keep it
    expect(egt[1].id).toBe(seedVersionId('egt-rtd-sensor', 2))
    expect(egt[1].current_version).toBe(2)
    expect(egt[1].definition.kind).toBe('sensor_circuit')
    expect(egt[1].definition.codePatterns).not.toContain('SPN 3242 FMI *')
    // new cards arrive at version 1
    expect((await versions('aftertreatment-overtemp')).map(v => v.card_version)).toEqual([1])
    // the admin's battery card is untouched, and the seed says so
    const bat = await versions('battery-charging')
    expect(bat.map(v => [v.card_version, v.current_version])).toEqual([[1, 2], [2, 2]])
    expect(bat[1].definition.title).toBe('Batteries, as our shop does it')
    expect(log.join('\n')).toMatch(/"battery-charging" was changed by an admin: left as it is/)
    expect(log.join('\n')).toMatch(/"egt-rtd-sensor" moved to seed revision 2 as version 2/)

    // a second run changes nothing
    const count = async () => (await pool.query('SELECT count(*)::int AS n FROM test_card_versions')).rows[0].n
    const n = await count()
    await db.transaction(tx => seedCards(tx as unknown as typeof db, () => {}))
    expect(await count()).toBe(n)
    const cards = (await pool.query('SELECT slug FROM test_cards')).rows.map(r => r.slug)
    for (const c of SEED_CARDS) expect(cards).toContain(c.slug)
  })

  it('plans by the id of the current version row', () => {
    // our own rule: only versions the seed wrote are upgraded
    const card = { slug: 'egt-rtd-sensor', revision: 2 }
    expect(seedPlan(card, undefined)).toBe('insert')
    expect(seedPlan(card, seedVersionId('egt-rtd-sensor', 1))).toBe('upgrade')
    expect(seedPlan(card, seedVersionId('egt-rtd-sensor', 2))).toBe('current')
    expect(seedPlan(card, randomUUID())).toBe('edited')
  })
})
