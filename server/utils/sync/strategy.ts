// How a push writes: the fast pass first, the careful rerun when the database refuses a row.
// Fast: no savepoints, and the creates left at the end ride in the push's closing statement; a
// refused row ends the pass (PushRefused), its transaction rolls back and syncPush (push.ts) runs
// the push again with the careful strategy. Careful: a savepoint around each write, so a refused
// row rejects only its own op and the rest apply.
import { sql } from 'drizzle-orm'
import type { Tx } from '../db'
import { stableSyncJson } from './merge'
import { isRetryableTxError, pgErrorCode } from './retry'

export interface ApplyStrategy {
  readonly name: 'fast' | 'careful'
  /** Whether the creates left at the end go into the push's closing statement (else they are written at once). */
  readonly defersCreates: boolean
  /** Runs one write: the fast pass as it is, the careful one inside a savepoint. */
  guard<T>(tx: Tx, fn: () => Promise<T>): Promise<T>
}

/** The fast pass met a row the database refused: nothing of it stays, and the push runs again carefully. */
export class PushRefused extends Error {
  constructor(readonly refusal: unknown) {
    super('a row was refused; the push runs again op by op')
  }
}

/** A refusal of the data (SQLSTATE class 22 or 23), as opposed to a failure of the server. */
export function isDataRefusal(err: unknown): boolean {
  const code = pgErrorCode(err)
  return !!code && (code.startsWith('22') || code.startsWith('23'))
}

/** Why the database refused a row, naming the field where it can tell. */
export function refusalReason(err: unknown, values: Record<string, unknown>): string {
  const cause = ((err as { cause?: unknown }).cause ?? err) as { message?: string, column?: string, constraint?: string }
  // A NUL deep inside a JSON value is the one refusal the schemas cannot see; find its field.
  const nul = Object.keys(values).find(k => stableSyncJson(values[k]).includes('\\u0000'))
  const what = cause.column ?? nul ?? cause.constraint ?? 'record'
  return `${what}: the database refused it (${cause.message ?? 'invalid'})`
}

export const FAST_PASS: ApplyStrategy = {
  name: 'fast',
  defersCreates: true,
  async guard(_tx, fn) {
    try {
      return await fn()
    }
    catch (err) {
      throw isDataRefusal(err) ? new PushRefused(err) : err
    }
  },
}

let savepoints = 0

export const CAREFUL_PASS: ApplyStrategy = {
  name: 'careful',
  defersCreates: false,
  async guard(tx, fn) {
    const name = sql.raw(`sync_sp_${++savepoints}`)
    await tx.execute(sql`SAVEPOINT ${name}`)
    try {
      const out = await fn()
      await tx.execute(sql`RELEASE SAVEPOINT ${name}`)
      return out
    }
    catch (err) {
      // A failed statement aborts the transaction until it rolls back to the savepoint.
      if (!isRetryableTxError(err)) await tx.execute(sql`ROLLBACK TO SAVEPOINT ${name}`)
      throw err
    }
  },
}
