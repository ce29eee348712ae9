// Wayside's own starter test cards, written from general trade knowledge in our own words (the
// cards themselves live in ./cardLibrary). They are a starting point: an admin edits them to the
// maker's data for the units the shop sees, and each edit makes a new version.
//
// Each seeded card has a revision. A database seeded with an older revision gets the new one as
// a new version on top, as long as the card's current version is one the seed wrote; a card an
// admin has changed since is left as the admin made it (the seed says so and moves on).
import { and, eq, sql } from 'drizzle-orm'
import type { NodePgDatabase } from 'drizzle-orm/node-postgres'
import * as t from '../schema'
import { cardDefinitionSchema, type CardDefinitionInput } from '../../../shared/schemas/testCards'
import { seedId } from './ids'
import { AIR_BRAKE_CARD, TIRE_CARD } from './cardLibrary/chassisCards'
import { AFTERTREATMENT_OVERTEMP_CARD, DEF_CARD, ENGINE_OVERTEMP_CARD } from './cardLibrary/conditionCards'
import { BATTERY_CARD, CRANKING_CHARGING_CARD, NOX_CARD } from './cardLibrary/electricalCards'
import { DPF_DP_CARD, ECT_CARD, EGT_CARD, REFERENCE_CARD } from './cardLibrary/sensorCards'

export interface SeedCard { slug: string, revision: number, definition: CardDefinitionInput }

export const SEED_CARDS: SeedCard[] = [
  { slug: 'egt-rtd-sensor', revision: 2, definition: EGT_CARD },
  { slug: 'aftertreatment-overtemp', revision: 1, definition: AFTERTREATMENT_OVERTEMP_CARD },
  { slug: 'coolant-temp-ntc', revision: 2, definition: ECT_CARD },
  { slug: 'engine-overtemp', revision: 1, definition: ENGINE_OVERTEMP_CARD },
  { slug: 'sensor-5v-reference', revision: 2, definition: REFERENCE_CARD },
  { slug: 'dpf-pressure-sensor', revision: 1, definition: DPF_DP_CARD },
  { slug: 'nox-sensor-can', revision: 1, definition: NOX_CARD },
  { slug: 'battery-charging', revision: 2, definition: BATTERY_CARD },
  { slug: 'cranking-charging', revision: 1, definition: CRANKING_CHARGING_CARD },
  { slug: 'def-concentration', revision: 2, definition: DEF_CARD },
  { slug: 'tire-wheel-end', revision: 1, definition: TIRE_CARD },
  { slug: 'air-brakes', revision: 1, definition: AIR_BRAKE_CARD },
]

/** The id of the version row a seed revision writes (revision 1 keeps the id the first seed used). */
export const seedVersionId = (slug: string, revision: number) => seedId(revision === 1 ? `card:${slug}:v1` : `card:${slug}:rev${revision}`)

export type SeedPlan = 'insert' | 'upgrade' | 'current' | 'edited'

/** What the seed does with one card, given the id of its current version row (undefined: no such card yet). */
export function seedPlan(card: Pick<SeedCard, 'slug' | 'revision'>, currentVersionRowId: string | undefined): SeedPlan {
  if (currentVersionRowId === undefined) return 'insert'
  if (currentVersionRowId === seedVersionId(card.slug, card.revision)) return 'current'
  for (let r = 1; r < card.revision; r++) if (currentVersionRowId === seedVersionId(card.slug, r)) return 'upgrade'
  return 'edited'
}

type Db = NodePgDatabase<typeof t>

/** Inserts the starter cards, or moves cards still at an older seed revision to the new one. */
export async function seedCards(db: Db, log: (line: string) => void = console.log) {
  const author = seedId('user:admin')
  for (const card of SEED_CARDS) {
    const definition = cardDefinitionSchema.parse(card.definition) as unknown as Record<string, unknown> // a bad seed fails loudly here
    const cardId = seedId(`card:${card.slug}`)
    const [row] = await db.select({ currentVersion: t.testCards.currentVersion, versionId: t.testCardVersions.id }).from(t.testCards)
      .leftJoin(t.testCardVersions, and(
        eq(t.testCardVersions.cardId, t.testCards.id), eq(t.testCardVersions.cardVersion, t.testCards.currentVersion),
      ))
      .where(eq(t.testCards.id, cardId)).for('update', { of: t.testCards })
    const plan = seedPlan(card, row ? (row.versionId ?? '') : undefined)
    const versionId = seedVersionId(card.slug, card.revision)
    const names = { title: String(definition.title), componentType: String(definition.componentType) }
    if (plan === 'insert') {
      const [taken] = await db.select({ id: t.testCards.id }).from(t.testCards).where(eq(t.testCards.slug, card.slug))
      if (taken) {
        log(`[wayside] a test card named "${card.slug}" already exists: the seeded one is not added`)
        continue
      }
      await db.insert(t.testCards).values({ id: cardId, slug: card.slug, ...names, currentVersion: 1 })
      await db.insert(t.testCardVersions).values({ id: versionId, cardId, cardVersion: 1, definition, authorId: author })
    }
    else if (plan === 'upgrade') {
      const next = row!.currentVersion + 1
      await db.insert(t.testCardVersions).values({ id: versionId, cardId, cardVersion: next, definition, authorId: author })
      await db.update(t.testCards).set({ ...names, currentVersion: next, updatedAt: sql`now()` }).where(eq(t.testCards.id, cardId))
      log(`[wayside] test card "${card.slug}" moved to seed revision ${card.revision} as version ${next}`)
    }
    else if (plan === 'edited') {
      log(`[wayside] test card "${card.slug}" was changed by an admin: left as it is (seed revision ${card.revision} not applied)`)
    }
  }
}
