// Durable jobs in PostgreSQL through pg-boss (10.4: the line whose engines accept Node 20). Jobs
// live in the database, not in a process: any app server may work them, and pg-boss hands each
// job to one worker at a time.
import PgBoss from 'pg-boss'
import type pg from 'pg'

let boss: PgBoss | undefined

/** The queue client; sending needs no started worker, only the schema the plugin installs. */
export function useBoss(): PgBoss {
  if (!boss) {
    boss = new PgBoss({ connectionString: useRuntimeConfig().databaseUrl, max: 4, application_name: 'wayside-jobs' })
    boss.on('error', err => console.error('[jobs]', err.message))
  }
  return boss
}

/** pg-boss writes on the caller's connection, so a job commits (or rolls back) with its transaction. */
export function jobDbOf(tx: Tx): PgBoss.Db {
  const client = (tx as unknown as { session: { client: pg.PoolClient } }).session.client
  return { executeSql: (text, values) => client.query(text, values) }
}

/** A start that failed half-way keeps its pool and will not start again: close it, and make a fresh client next time. */
async function dropBoss(b: PgBoss) {
  if (boss === b) boss = undefined
  await b.stop({ graceful: false, wait: true }).catch(() => undefined)
  const db = b.getDb() as PgBoss.Db & { opened?: boolean, close?: () => Promise<void> }
  if (db.opened) await db.close?.().catch(() => undefined)
}

/** Installs the queue schema, creates the queues and, unless turned off, works them here. */
export async function startJobs() {
  const b = useBoss()
  try {
    await setUp(b)
  }
  catch (err) {
    await dropBoss(b)
    throw err
  }
}

async function setUp(b: PgBoss) {
  const c = useRuntimeConfig()
  await b.start()
  const retry = { retryLimit: Number(c.mailRetryLimit), retryDelay: Number(c.mailRetryDelaySeconds), retryBackoff: true }
  // Longer than an attempt can take with the SMTP timeouts, so a live attempt is never taken twice.
  const mailQueue = { name: MAIL_QUEUE, ...retry, expireInSeconds: 180, retentionDays: 14 }
  // Both are safe when another app server does the same at the same time.
  await b.createQueue(MAIL_QUEUE, mailQueue)
  await b.updateQueue(MAIL_QUEUE, mailQueue)
  if (!c.jobsWork) return
  await b.work<{ mailId: string }>(MAIL_QUEUE, { includeMetadata: true, batchSize: 1, pollingIntervalSeconds: Number(c.jobsPollSeconds) },
    async ([job]) => {
      if (!job) return
      await deliverMail(job.data.mailId, { retryCount: job.retryCount, retryLimit: job.retryLimit })
    })
}

export async function stopJobs() {
  await boss?.stop({ graceful: true, timeout: 10_000 })
}
