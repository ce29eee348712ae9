// Links opened without an account: a random token in the address, only its SHA-256 kept, an expiry,
// and a way to revoke it. One table for every purpose (the fleet's status link, the fleet's approval
// of an estimate), so each feature asks the same questions the same way.
import { createHash, randomBytes, timingSafeEqual } from 'node:crypto'
import { and, desc, eq, gt, isNull } from 'drizzle-orm'

export const LINK_PURPOSES = ['call_status', 'estimate_approval'] as const
export type LinkPurpose = (typeof LINK_PURPOSES)[number]

/** 32 random bytes (256 bits), written base64url: always 43 characters. */
const TOKEN_BYTES = 32
const TOKEN_FORM = /^[\w-]{43}$/

export type LiveLink = {
  id: string
  subjectId: string
  expiresAt: Date
  createdAt: Date
  createdBy: string | null
  lastOpenedAt: Date | null
}
type LinkRow = typeof tables.links.$inferSelect
const live = (r: LinkRow): LiveLink => ({
  id: r.id, subjectId: r.subjectId, expiresAt: r.expiresAt, createdAt: r.createdAt, createdBy: r.createdBy, lastOpenedAt: r.lastOpenedAt,
})

/** The hex SHA-256 of a token: what the table keeps and looks up. */
export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex')
}

/** The one answer for a link that is malformed, unknown, of another purpose, expired or revoked. */
export function linkNotFound(): never {
  throw createError({ status: 404, statusText: 'Not Found', message: 'This link does not work. Ask whoever sent it for a new one.' })
}

/** The address people open: the site's own, with `path` (e.g. '/s/') and the token. */
export function linkUrl(path: string, token: string): string {
  return `${useRuntimeConfig().siteUrl.replace(/\/$/, '')}${path}${token}`
}

/**
 * Makes a link; the token is answered once and never stored. With `replace`, the subject's other live
 * links of the same purpose are revoked in the same transaction, so only the newest works.
 */
export type NewLink = { purpose: LinkPurpose, subjectId: string, expiresAt: Date, createdBy?: string | null, replace?: boolean }
export async function makeLink(input: NewLink, tx?: Tx): Promise<{ id: string, token: string, expiresAt: Date }> {
  if (!tx) return useDb().transaction(t => makeLink(input, t))
  if (input.replace) await revokeLinks(input.purpose, input.subjectId, tx)
  const token = randomBytes(TOKEN_BYTES).toString('base64url')
  const [row] = await tx.insert(tables.links).values({
    purpose: input.purpose, subjectId: input.subjectId, tokenHash: hashLinkToken(token), expiresAt: input.expiresAt,
    createdBy: input.createdBy ?? null,
  }).returning({ id: tables.links.id, expiresAt: tables.links.expiresAt })
  return { id: row!.id, token, expiresAt: row!.expiresAt }
}

/**
 * The live link a token opens, or null. The lookup goes by the hash's unique index; the stored hash
 * is then compared in constant time, so nothing about a near miss shows in the answer's timing.
 */
export async function checkLink(purpose: LinkPurpose, token: unknown): Promise<LiveLink | null> {
  if (typeof token !== 'string' || !TOKEN_FORM.test(token)) return null
  const hash = hashLinkToken(token)
  const [row] = await useDb().select().from(tables.links).where(eq(tables.links.tokenHash, hash)).limit(1)
  if (!row) return null
  const same = timingSafeEqual(Buffer.from(row.tokenHash, 'hex'), Buffer.from(hash, 'hex'))
  if (!same || row.purpose !== purpose || row.revokedAt || row.expiresAt.getTime() <= Date.now()) return null
  return live(row)
}

/** `checkLink`, throwing the one 404 when it does not open. */
export async function requireLink(purpose: LinkPurpose, token: unknown): Promise<LiveLink> {
  return (await checkLink(purpose, token)) ?? linkNotFound()
}

/** Revokes every live link of the subject for this purpose; answers how many. */
export async function revokeLinks(purpose: LinkPurpose, subjectId: string, tx?: Tx): Promise<number> {
  const rows = await (tx ?? useDb()).update(tables.links).set({ revokedAt: new Date() })
    .where(and(eq(tables.links.purpose, purpose), eq(tables.links.subjectId, subjectId), isNull(tables.links.revokedAt)))
    .returning({ id: tables.links.id })
  return rows.length
}

/** The subject's newest live link of this purpose (not its token, which is not kept), or null. */
export async function liveLinkFor(purpose: LinkPurpose, subjectId: string): Promise<LiveLink | null> {
  const [row] = await useDb().select().from(tables.links)
    .where(and(eq(tables.links.purpose, purpose), eq(tables.links.subjectId, subjectId), isNull(tables.links.revokedAt),
      gt(tables.links.expiresAt, new Date())))
    .orderBy(desc(tables.links.createdAt)).limit(1)
  return row ? live(row) : null
}

/** Notes when a link was last opened (for the office's panel); never fails the opening. */
export async function touchLink(id: string) {
  await useDb().update(tables.links).set({ lastOpenedAt: new Date() }).where(eq(tables.links.id, id)).catch(() => undefined)
}
