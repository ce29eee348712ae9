// POST /api/sync/push: one transaction per push. The sync_clients row is locked first, so two
// pushes from one device run one after the other and the second finds the first's ops already
// stored (duplicates). Ops, their stored results and the client's last seq commit together.
// A push runs with the fast strategy; if the database refuses a row it runs again, whole, with the
// careful one (strategy.ts), which rejects only the refused ops.
import { and, eq, inArray, sql, type SQL } from 'drizzle-orm'
import type { User } from '#auth-utils'
import type { PushBody, PushResult } from '#shared/schemas/sync'
import { applySyncOps } from './apply'
import type { OpOutcome } from './context'
import { bulkInsertSql } from './bulk'
import { pgErrorCode, withTxRetry } from './retry'
import { CAREFUL_PASS, FAST_PASS, isDataRefusal, PushRefused, type ApplyStrategy } from './strategy'
import { syncTestInjectSerializationFailure, syncTestPause } from './testHooks'

/** An op past the next expected seq: nothing was applied; the device resends from expectedSeq. */
export class SyncSeqGapError extends Error {
  constructor(readonly expectedSeq: number, readonly lastSeq: number, readonly gotSeq: number) {
    super(`Expected seq ${expectedSeq}, got ${gotSeq}`)
  }
}

type Result = PushResult['results'][number]

export async function syncPush(user: User, body: PushBody, meta: { userAgent?: string } = {}): Promise<PushResult> {
  const answer = await pushWith(FAST_PASS, user, body, meta) ?? await pushWith(CAREFUL_PASS, user, body, meta)
  await syncTestPause('after-commit')
  return answer!
}

/** The push under one strategy; undefined when the fast pass met a refused row (and rolled back). */
async function pushWith(strategy: ApplyStrategy, user: User, body: PushBody, meta: { userAgent?: string }) {
  try {
    return await pushOnce(user, body, meta, strategy)
  }
  catch (err) {
    if (err instanceof PushRefused && strategy === FAST_PASS) return undefined
    throw err
  }
}

function pushOnce(user: User, body: PushBody, meta: { userAgent?: string }, strategy: ApplyStrategy): Promise<PushResult> {
  const photoMaxBytes = Number(useRuntimeConfig().photoMaxBytes)
  const userAgent = meta.userAgent?.slice(0, 300) ?? null
  return withTxRetry(() => useDb().transaction(async (tx) => {
    const { syncOps, users } = tables
    // Registers the device on its first push and locks its row: a second push from the same
    // device waits here until this one commits, then finds its ops stored.
    const registered = await tx.execute<{ user_id: string, last_seq: string }>(sql`
      INSERT INTO sync_clients (id, user_id, user_agent) VALUES (${body.clientId}, ${user.id}, ${userAgent})
      ON CONFLICT (id) DO UPDATE SET last_seen_at = now()
      RETURNING user_id, last_seq`)
    const row = registered.rows[0]!
    if (row.user_id !== user.id) throw createError({ status: 403, statusText: 'This device is registered to another person' })
    const client = { id: body.clientId, lastSeq: Number(row.last_seq) }

    const fresh = body.ops.filter(op => op.seq > client.lastSeq)
    const dups = body.ops.filter(op => op.seq <= client.lastSeq)
    fresh.forEach((op, i) => {
      if (op.seq !== client.lastSeq + 1 + i) throw new SyncSeqGapError(client.lastSeq + 1, client.lastSeq, op.seq)
    })

    const stored = dups.length
      ? await tx.select().from(syncOps).where(and(eq(syncOps.clientId, client.id), inArray(syncOps.seq, dups.map(o => o.seq))))
      : []
    const storedBySeq = new Map(stored.map(s => [s.seq, s]))
    const results = new Map<string, Result>()
    for (const op of dups) {
      const s = storedBySeq.get(op.seq)
      if (s && s.opId !== op.opId) {
        // The seq was used by another op of this device: this one was never applied.
        const reason = `seq: ${op.seq} was already used by another op from this device`
        results.set(op.opId, { opId: op.opId, seq: op.seq, status: 'rejected', reason })
        continue
      }
      const r: Result = { opId: op.opId, seq: op.seq, status: 'duplicate' }
      if (s && s.status !== 'duplicate') r.original = s.status
      if (s?.version != null) r.version = s.version
      if (s?.reason) r.reason = s.reason
      results.set(op.opId, r)
    }

    if (body.position) {
      // Device time, but never in the future, and never older than what we already know.
      const at = sql`LEAST(${new Date(body.position.at)}::timestamptz, now())`
      await tx.update(users).set({ lastLat: body.position.lat, lastLon: body.position.lon, lastPositionAt: at })
        .where(and(eq(users.id, user.id), sql`(${users.lastPositionAt} IS NULL OR ${users.lastPositionAt} < ${at})`))
    }

    let outcomes: OpOutcome[] = []
    let closing: SQL[] = []
    if (fresh.length) ({ outcomes, closing } = await applySyncOps(tx, user, fresh, { photoMaxBytes }, strategy))
    const lastSeq = fresh.length ? fresh[fresh.length - 1]!.seq : client.lastSeq
    const advance = sql`UPDATE sync_clients SET last_seq = ${lastSeq}, last_seen_at = now(),
      user_agent = coalesce(${userAgent}, user_agent) WHERE id = ${client.id}`
    if (fresh.length) {
      // The ops' stored results and the new last seq in one statement.
      const opRows = fresh.map((op, i) => ({
        opId: op.opId, clientId: client.id, seq: op.seq, entity: op.entity, entityId: op.entityId, action: op.action,
        status: outcomes[i]!.status, version: outcomes[i]!.version ?? null, reason: outcomes[i]!.reason ?? null,
      }))
      // The fast pass's last inserts, the ops' stored results and the new last seq: one statement.
      const parts = [...closing, bulkInsertSql(syncOps, opRows, { returning: false })].map((q, i) => sql`${sql.raw(`w${i}`)} AS (${q})`)
      try {
        await tx.execute(sql`WITH ${sql.join(parts, sql`, `)} ${advance}`)
      }
      catch (err) {
        throw strategy === FAST_PASS && isDataRefusal(err) ? new PushRefused(err) : err
      }
      fresh.forEach((op, i) => {
        const o = outcomes[i]!
        const r: Result = { opId: op.opId, seq: op.seq, status: o.status }
        if (o.version !== undefined) r.version = o.version
        if (o.reason) r.reason = o.reason
        results.set(op.opId, r)
      })
    }
    else await tx.execute(advance)

    if (syncTestInjectSerializationFailure()) {
      await tx.execute(sql`DO $$ BEGIN RAISE EXCEPTION 'injected by the sync fault test' USING ERRCODE = '40001'; END $$`)
    }
    await syncTestPause('before-commit')
    return { lastSeq, results: body.ops.map(op => results.get(op.opId)!) }
  }), { onRetry: (attempt, err) => console.warn(`[sync] push retried (attempt ${attempt + 1}) after SQLSTATE ${pgErrorCode(err)}`) })
}
