// Every e-mail is a durable job: `queueMail` writes the message (mail_log) and its job (pg-boss)
// in one transaction and returns at once; the app process works the job (server/plugins/jobs.ts)
// with retries and backoff, so nobody waits on a mail server and nothing is lost in a restart.
import { randomUUID } from 'node:crypto'
import { and, desc, eq, inArray } from 'drizzle-orm'
import nodemailer, { type Transporter } from 'nodemailer'
import type { User } from '#auth-utils'

let transport: Transporter | undefined

function useTransport(): Transporter {
  if (!transport) {
    const c = useRuntimeConfig()
    transport = nodemailer.createTransport({
      host: c.smtpHost, port: Number(c.smtpPort), secure: false,
      // The local catcher speaks plain SMTP; a real relay upgrades with STARTTLS when offered.
      ignoreTLS: c.smtpHost === '127.0.0.1' || c.smtpHost === 'localhost',
      auth: c.smtpUser ? { user: c.smtpUser, pass: c.smtpPass } : undefined,
      // Seconds, not nodemailer's minutes: a stalled server fails the attempt and the job retries.
      connectionTimeout: Number(c.smtpConnectionTimeoutMs), greetingTimeout: Number(c.smtpGreetingTimeoutMs),
      socketTimeout: Number(c.smtpSocketTimeoutMs), dnsTimeout: Number(c.smtpConnectionTimeoutMs),
    })
  }
  return transport
}

export type MailRelated = { type: 'invoice' | 'call' | 'customer', id: string }
export type MailRequest = {
  /** What the message is, e.g. `invoice`, `call_assigned`, `service_report`, `statement`. */
  kind: string
  to: string
  subject: string
  text: string
  html?: string
  /** Made when the job sends, from the recipes in server/utils/mailAttachments.ts. */
  attachments?: MailAttachmentRecipe[]
  /** The record the message shows on, with its state and a "Send again". */
  related?: MailRelated
  queuedBy?: User | null
}
type MailBody = { text: string, html?: string, attachments?: MailAttachmentRecipe[] }

export const MAIL_QUEUE = 'mail'

/** Writes the message's row; its Message-ID is fixed here, so every attempt sends the same message. */
async function logMail(tx: Db | Tx, mail: MailRequest, status: 'queued' | 'failed', error: string | null = null) {
  const id = randomUUID()
  const messageId = `<${id}@${useRuntimeConfig().mailIdDomain}>`
  const body: MailBody = { text: mail.text, html: mail.html, attachments: mail.attachments }
  await tx.insert(tables.mailLog).values({
    id, kind: mail.kind, toAddress: mail.to, subject: mail.subject, relatedId: mail.related?.id, relatedType: mail.related?.type,
    messageId, status, error, body, queuedBy: mail.queuedBy?.id,
  })
  return { id, messageId }
}

/** Queues one message; pass the caller's transaction so the message exists only if the work does. */
export async function queueMail(mail: MailRequest, tx?: Tx): Promise<{ id: string, messageId: string }> {
  if (!tx) return useDb().transaction(t => queueMail(mail, t))
  const logged = await logMail(tx, mail, 'queued')
  await sendJob(tx, logged.id)
  return logged
}

/**
 * Queues a notice inside the caller's transaction, so it commits with the work it tells of. When the
 * queue cannot take it (its tables not installed yet, say), only the queueing is undone, at a savepoint:
 * the work still commits, and the message is kept as not sent, with the reason and "Send again".
 */
export async function queueNotice(mail: MailRequest, tx: Tx): Promise<{ queued: boolean, reason?: string }> {
  try {
    await tx.transaction(savepoint => queueMail(mail, savepoint))
    return { queued: true }
  }
  catch (err) {
    console.error(`[mail] ${mail.kind} not queued:`, (err as Error).message)
    await logMail(tx, mail, 'failed', `The mail queue did not take the message (${(err as Error).message})`)
    return { queued: false, reason: 'The e-mail could not be queued; phone the mechanic, or use Send again on the call' }
  }
}

async function sendJob(tx: Tx, mailId: string) {
  const jobId = await useBoss().send(MAIL_QUEUE, { mailId }, { db: jobDbOf(tx) })
  if (!jobId) throw new Error(`The ${MAIL_QUEUE} queue is missing; the job plugin creates it at start`)
}

/** "Send again": a message that failed (or is waiting to retry) goes back in the queue now. */
export async function requeueMail(id: string, user: User) {
  return useDb().transaction(async (tx) => {
    const [m] = await tx.select().from(tables.mailLog).where(eq(tables.mailLog.id, id)).for('update')
    if (!m) throw createError({ status: 404, statusText: 'No such message' })
    if (m.status === 'sent') ruleError('id', 'This message was sent already')
    if (m.status === 'sending') ruleError('id', 'This message is being sent right now')
    if (!m.body) ruleError('id', 'This message was logged before mail was queued and cannot be sent again; send the record again')
    await tx.update(tables.mailLog).set({ status: 'queued', error: null, queuedBy: user.id }).where(eq(tables.mailLog.id, id))
    await sendJob(tx, id)
  })
}

/** An attempt that started this recently may still be talking to the mail server elsewhere. */
const IN_FLIGHT_MS = 3 * 60_000

/**
 * Works one mail job: claims the message, sends it with its fixed Message-ID, records the result.
 * Exactly one message per job where it can be told: a message already sent is never sent again,
 * and two workers never send at once. What remains: if the process dies after the mail server
 * took the message but before `sent` is written, a later attempt sends it again, with the same
 * Message-ID, which mail stores and clients use to recognise the copy.
 */
export async function deliverMail(mailId: string, attempt: { retryCount: number, retryLimit: number }) {
  const db = useDb()
  const claimed = await db.transaction(async (tx) => {
    const [m] = await tx.select().from(tables.mailLog).where(eq(tables.mailLog.id, mailId)).for('update')
    if (!m || m.status === 'sent' || !m.body) return null
    const busyElsewhere = m.status === 'sending' && m.lastAttemptAt && Date.now() - m.lastAttemptAt.getTime() < IN_FLIGHT_MS
    if (busyElsewhere) throw new Error('Another attempt at this message is in progress')
    await tx.update(tables.mailLog).set({ status: 'sending', attempts: m.attempts + 1,
      lastAttemptAt: new Date() }).where(eq(tables.mailLog.id, mailId))
    return m
  })
  if (!claimed) return 'nothing to send'
  const body = claimed.body as MailBody
  try {
    const attachments = await Promise.all((body.attachments ?? []).map(renderMailAttachment))
    await useTransport().sendMail({
      from: useRuntimeConfig().mailFrom, to: claimed.toAddress, subject: claimed.subject, text: body.text, html: body.html,
      attachments, messageId: claimed.messageId ?? undefined,
    })
  }
  catch (err) {
    const last = attempt.retryCount >= attempt.retryLimit
    const reason = describeMailError(err)
    await db.update(tables.mailLog).set({ status: last ? 'failed' : 'retrying', error: reason }).where(eq(tables.mailLog.id, mailId))
    throw new Error(reason)
  }
  await db.update(tables.mailLog).set({ status: 'sent', sentAt: new Date(), error: null }).where(eq(tables.mailLog.id, mailId))
  return 'sent'
}

/** A reason a person can act on. */
function describeMailError(err: unknown): string {
  const e = err as { code?: string, message?: string, responseCode?: number }
  if (e.code === 'ETIMEDOUT' || e.code === 'ESOCKET' || /timeout/i.test(e.message ?? '')) {
    return `The mail server did not answer in time (${e.message ?? e.code})`
  }
  if (e.code === 'ECONNECTION' || e.code === 'ECONNREFUSED') return `Could not reach the mail server (${e.message ?? e.code})`
  if (e.responseCode) return `The mail server refused the message: ${e.message}`
  return e.message ?? 'The message could not be sent'
}

/** The messages about one record, newest first, for its page. */
export async function mailFor(relatedId: string) {
  return useDb().select({
    id: tables.mailLog.id, kind: tables.mailLog.kind, toAddress: tables.mailLog.toAddress, subject: tables.mailLog.subject,
    status: tables.mailLog.status, error: tables.mailLog.error, attempts: tables.mailLog.attempts, queuedAt: tables.mailLog.queuedAt,
    lastAttemptAt: tables.mailLog.lastAttemptAt, sentAt: tables.mailLog.sentAt, canSendAgain: tables.mailLog.body,
  }).from(tables.mailLog).where(eq(tables.mailLog.relatedId, relatedId)).orderBy(desc(tables.mailLog.queuedAt)).limit(20)
    .then(rows => rows.map(r => ({ ...r, canSendAgain: !!r.canSendAgain && ['failed', 'retrying'].includes(r.status) })))
}

/** Which roles see the mail of a record: invoices are the office's; calls are also dispatch's. */
export async function mailRelatedType(id: string) {
  const [row] = await useDb().select({ type: tables.mailLog.relatedType }).from(tables.mailLog)
    .where(and(eq(tables.mailLog.relatedId, id), inArray(tables.mailLog.relatedType, ['invoice', 'call', 'customer']))).limit(1)
  return row?.type ?? null
}
