import { and, asc, desc, eq, sql } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { z } from 'zod'
import {
  cardDefinitionSchema, type CardDefinition, type TestCardView,
  type testCardCreateSchema, type testCardJudgeSchema, type testCardPatchSchema,
} from '#shared/schemas/testCards'
import { judgeStep, targetText, type StepEntry } from '#shared/utils/cardRun'
import { faultCodeKey, suggestTestCards, type FaultCodeRef } from '#shared/utils/faultMatch'

type CardRow = typeof tables.testCards.$inferSelect
type VersionRow = typeof tables.testCardVersions.$inferSelect

// Stored definitions are checked on the way out too: a row written around the routes (a script,
// an older format) is marked with what is wrong instead of reaching a phone that cannot run it.
function view(card: CardRow, v: VersionRow): TestCardView {
  const parsed = cardDefinitionSchema.safeParse(v.definition)
  const out: TestCardView = {
    id: card.id, slug: card.slug, title: card.title, componentType: card.componentType, active: card.active,
    currentVersion: card.currentVersion, version: v.cardVersion,
    definition: parsed.success ? parsed.data : (v.definition as unknown as CardDefinition),
    updatedAt: card.updatedAt.toISOString(),
  }
  if (!parsed.success) out.problem = describeFieldErrors(fieldErrorsOf(parsed.error))
  return out
}

/** The library at its latest versions; mechanics and office staff see only cards in use. */
export async function listTestCards(user: User, opts: { all: boolean }) {
  const { testCards, testCardVersions } = tables
  const showAll = opts.all && user.role === 'admin'
  const rows = await useDb().select({ card: testCards, v: testCardVersions }).from(testCards)
    .innerJoin(testCardVersions, and(eq(testCardVersions.cardId, testCards.id), eq(testCardVersions.cardVersion, testCards.currentVersion)))
    .where(showAll ? undefined : eq(testCards.active, true))
    .orderBy(asc(testCards.title))
  const items = rows.map(r => view(r.card, r.v))
  return { items: showAll ? items : items.filter(c => !c.problem) }
}

/**
 * The cards that fit these fault codes, best first, by the same rule as the phone's card picker
 * (a data-valid code never reaches a sensor-circuit card). Each item says which codes it fits.
 */
export async function suggestTestCardsFor(user: User, codes: FaultCodeRef[]) {
  const { items } = await listTestCards(user, { all: false })
  const fits = suggestTestCards(items, codes)
  return { codes: codes.map(faultCodeKey), items: fits.map(s => ({ ...s.card, matches: s.matches })) }
}

/**
 * One entry judged against one step of a card version, exactly as the phone's runner judges it:
 * a sensor step without the maker's data answers that it needs it, not a verdict.
 */
export async function judgeTestCardStep(id: string, input: z.output<typeof testCardJudgeSchema>) {
  const card = await getTestCard(id, input.version)
  if (!card) return undefined
  if (card.problem) ruleError('version', `This card version does not pass the card checks: ${card.problem}`)
  const step = card.definition.steps.find(s => s.id === input.stepId)
  if (!step) ruleError('stepId', `Card "${card.title}" version ${card.version} has no step "${input.stepId}"`)
  let entry: StepEntry
  type Reading = Extract<StepEntry, { reading: unknown }>
  if (input.reading) {
    entry = { reading: input.reading as Reading['reading'] }
    if (input.partTemp) entry.partTemp = input.partTemp as Reading['partTemp']
  }
  else if (input.answer !== undefined) entry = { answer: input.answer }
  else entry = { inputs: input.inputs! }
  const field = 'reading' in entry ? 'reading' : 'answer' in entry ? 'answer' : 'inputs'
  if (input.partTemp?.value === 'OL') ruleError('partTemp', 'A temperature is a number')
  try {
    const j = judgeStep(step, entry)
    const unjudged = j.verdict === 'unjudged'
    return {
      cardId: card.id, version: card.version, stepId: step.id,
      verdict: unjudged ? null : j.verdict, ...(unjudged ? { needs: 'maker_data' as const } : {}),
      explanation: j.explanation, partTempC: j.partTempC ?? null, limits: j.spec ?? null,
      next: { id: j.next, ...targetText(card, j.next) },
    }
  }
  catch (err) {
    if (!(err instanceof RangeError)) throw err
    ruleError(/part’s temperature|Part temperature|not a temperature/.test(err.message) ? 'partTemp' : field, err.message)
  }
}

/** One card at its latest version, or at `version` (runs keep the version they used). */
export async function getTestCard(id: string, version?: number): Promise<TestCardView | undefined> {
  const { testCards, testCardVersions, users } = tables
  const db = useDb()
  const card = await db.query.testCards.findFirst({ where: eq(testCards.id, id) })
  if (!card) return undefined
  const v = await db.query.testCardVersions.findFirst({
    where: and(eq(testCardVersions.cardId, id), eq(testCardVersions.cardVersion, version ?? card.currentVersion)),
  })
  if (!v) return undefined
  const versions = await db.select({ version: testCardVersions.cardVersion, createdAt: testCardVersions.createdAt, authorName: users.name })
    .from(testCardVersions).leftJoin(users, eq(users.id, testCardVersions.authorId))
    .where(eq(testCardVersions.cardId, id)).orderBy(desc(testCardVersions.cardVersion))
  return {
    ...view(card, v), versions: versions.map(x => ({ version: x.version, createdAt: x.createdAt.toISOString(), authorName: x.authorName })),
  }
}

export async function createTestCard(input: z.output<typeof testCardCreateSchema>, user: User): Promise<TestCardView> {
  const { testCards, testCardVersions } = tables
  const isUniqueViolation = (err: any) => err?.code === '23505' || err?.cause?.code === '23505'
  return useDb().transaction(async (tx) => {
    // The unique index settles a race between two admins; this check gives the usual case a plain answer.
    const taken = await tx.query.testCards.findFirst({ where: eq(testCards.slug, input.slug) })
    if (taken) ruleError('slug', 'Another card already has this short name')
    const d = input.definition
    const [card] = await tx.insert(testCards).values({
      slug: input.slug, title: d.title, componentType: d.componentType, currentVersion: 1,
    }).returning()
    const [v] = await tx.insert(testCardVersions).values({
      cardId: card!.id, cardVersion: 1, definition: d as unknown as Record<string, unknown>, authorId: user.id,
    }).returning()
    return view(card!, v!)
  }).catch((err) => {
    if (isUniqueViolation(err)) ruleError('slug', 'Another card already has this short name')
    throw err
  })
}

/**
 * A new definition inserts version N+1 and moves the card to it, in one transaction; the row
 * lock makes two admins saving at once get N+1 and N+2 (or a 409 when they sent baseVersion).
 */
export async function updateTestCard(
  id: string, patch: z.output<typeof testCardPatchSchema>, user: User,
): Promise<TestCardView | undefined> {
  const { testCards, testCardVersions } = tables
  return useDb().transaction(async (tx) => {
    const [card] = await tx.select().from(testCards).where(eq(testCards.id, id)).for('update')
    if (!card) return undefined
    if (patch.baseVersion !== undefined && patch.baseVersion !== card.currentVersion) {
      throw createError({
        status: 409, statusText: 'Changed meanwhile',
        message: `This card is at version ${card.currentVersion} now; you edited version ${patch.baseVersion}. `
          + 'Reload it and make your change again.',
        data: { currentVersion: card.currentVersion },
      })
    }
    const set: Partial<typeof testCards.$inferInsert> = {}
    if (patch.active !== undefined) set.active = patch.active
    if (patch.definition) {
      const next = card.currentVersion + 1
      await tx.insert(testCardVersions).values({
        cardId: id, cardVersion: next, definition: patch.definition as unknown as Record<string, unknown>, authorId: user.id,
      })
      Object.assign(set, { currentVersion: next, title: patch.definition.title, componentType: patch.definition.componentType })
    }
    const [updated] = await tx.update(testCards).set({ ...set, updatedAt: sql`now()` }).where(eq(testCards.id, id)).returning()
    const [v] = await tx.select().from(testCardVersions).where(and(
      eq(testCardVersions.cardId, id), eq(testCardVersions.cardVersion, updated!.currentVersion),
    ))
    return view(updated!, v!)
  })
}
