// Money on an invoice. Every way of paying (account post, money recorded by hand, a card through
// the payment page, a refund, a credit note) locks the invoice row first and writes in one
// transaction, so parallel requests queue behind each other and each sees what the one before did.
// A client's idempotency key is stored on the row it made: the same key answers with that row.
import { and, eq, ne, sql } from 'drizzle-orm'
import Stripe from 'stripe'
import type { H3Event } from 'h3'
import type { z } from 'zod'
import type { User } from '#auth-utils'
import { idempotencyKeySchema, METHODS_WITH_REFERENCE, PAYMENT_METHOD_WORDS, type paymentRecordSchema } from '#shared/schemas/payments'

let stripe: Stripe | undefined

/** The payment SDK, pointed at the configured host (the local fake unless set otherwise). */
export function useStripe(): Stripe {
  if (!stripe) {
    const c = useRuntimeConfig()
    stripe = new Stripe(c.stripeSecretKey, {
      host: c.stripeApiHost, port: Number(c.stripeApiPort), protocol: c.stripeApiProtocol as 'http' | 'https',
      // Retries are safe: every call that makes something carries an idempotency key.
      maxNetworkRetries: 1, telemetry: false, timeout: 15_000,
    })
  }
  return stripe
}

export type InvoiceRow = typeof tables.invoices.$inferSelect

/** The invoice, locked until the transaction ends: money on one invoice is written one at a time. */
export async function lockInvoice(tx: Tx, id: string): Promise<InvoiceRow> {
  const [inv] = await tx.select().from(tables.invoices).where(eq(tables.invoices.id, id)).for('update')
  if (!inv) throw createError({ status: 404, statusText: 'No such invoice' })
  return inv
}

/** The client's key for one intent: the Idempotency-Key header, else the body's idempotencyKey. */
export function readIdempotencyKey(event: H3Event, fromBody: string | undefined): string {
  const parsed = idempotencyKeySchema.safeParse(getRequestHeader(event, 'idempotency-key') ?? fromBody)
  if (!parsed.success) {
    const message = parsed.error.issues[0]?.message ?? 'Send an idempotency key'
    throw createError({ status: 400, statusText: 'Bad Request', message: `idempotencyKey: ${message}`,
      data: { fields: { idempotencyKey: message } } })
  }
  return parsed.data
}

/** 409 with what happened, for a second intent on an invoice the first one already settled. */
export function alreadyDone(message: string, inv: InvoiceRow): never {
  throw createError({ status: 409, statusText: 'Conflict', message, data: { fields: { status: message }, invoiceId: inv.id,
    status: inv.status } })
}

export function pgErrorOf(err: unknown): { code?: string, constraint?: string } {
  const e = err as { code?: string, constraint?: string, cause?: { code?: string, constraint?: string } }
  return { code: e?.code ?? e?.cause?.code, constraint: e?.constraint ?? e?.cause?.constraint }
}

async function sumOf(q: PromiseLike<{ n: number }[]>) { return (await q)[0]?.n ?? 0 }

/**
 * Recounts what the invoice has received, less refunds, and what credit notes took off; moves the
 * invoice (and its call) to paid when nothing is left to pay, and back when a refund reopens it.
 */
export async function settleInvoiceMoney(tx: Tx, inv: InvoiceRow, byUserId: string | null, why: string) {
  const { payments, refunds, creditNotes } = tables
  const received = await sumOf(tx.select({ n: sql<number>`coalesce(sum(${payments.amountCents}), 0)::int` }).from(payments)
    .where(and(eq(payments.invoiceId, inv.id), ne(payments.status, 'held'))))
  const refunded = await sumOf(tx.select({ n: sql<number>`coalesce(sum(${refunds.amountCents}), 0)::int` }).from(refunds)
    .where(eq(refunds.invoiceId, inv.id)))
  const creditedCents = await sumOf(tx.select({ n: sql<number>`coalesce(-sum(${creditNotes.totalCents}), 0)::int` }).from(creditNotes)
    .where(eq(creditNotes.invoiceId, inv.id)))
  const paidCents = received - refunded
  const money = invoiceMoney({ status: inv.status, totalCents: inv.totalCents, paidCents, creditedCents })
  let status = inv.status
  if (status !== 'void') {
    if (money.balanceCents <= 0) status = 'paid'
    else if (status === 'paid') status = 'sent'
  }
  const paidAt = status === 'paid' ? (inv.paidAt ?? new Date()) : null
  const [updated] = await tx.update(tables.invoices).set({ paidCents, creditedCents, status, paidAt }).where(eq(tables.invoices.id,
    inv.id)).returning()
  if (status === 'paid' && inv.status !== 'paid') await moveCall(tx, inv.callId, 'paid', byUserId, why)
  if (inv.status === 'paid' && status !== 'paid') await moveCall(tx, inv.callId, 'invoiced', byUserId, why)
  return { invoice: updated!, money }
}

async function moveCall(tx: Tx, callId: string, to: 'paid' | 'invoiced', byUserId: string | null, note: string) {
  const from = to === 'paid' ? 'invoiced' : 'paid'
  const now = new Date()
  const [moved] = await tx.update(tables.calls)
    .set({ status: to, paidAt: to === 'paid' ? now : null, statusChangedAt: now })
    .where(and(eq(tables.calls.id, callId), eq(tables.calls.status, from))).returning({ id: tables.calls.id })
  if (moved) await tx.insert(tables.callEvents).values({ callId, kind: 'status', fromStatus: from, toStatus: to, byUserId, note })
}

export type PaymentResult = { paymentId: string, replayed: boolean }

function invoiceNo(inv: InvoiceRow) { return `W-${inv.number}` }

/** Refuses a second intent on an invoice with nothing left to pay, saying what settled it. */
async function requireBalance(tx: Tx, inv: InvoiceRow) {
  if (inv.status === 'void') alreadyDone(`Invoice ${invoiceNo(inv)} is void; it takes no payment`, inv)
  const money = invoiceMoney(inv)
  if (money.balanceCents > 0) return money
  const [last] = await tx.select({ method: tables.payments.method, at: tables.payments.createdAt,
    by: tables.users.name }).from(tables.payments)
    .leftJoin(tables.users, eq(tables.users.id, tables.payments.byUserId))
    .where(eq(tables.payments.invoiceId, inv.id)).orderBy(sql`${tables.payments.createdAt} desc`).limit(1)
  const who = last?.by ? ` by ${last.by}` : ''
  const how = last ? `: ${PAYMENT_METHOD_WORDS[last.method].toLowerCase()}${who} at ${last.at.toISOString()}` : ''
  alreadyDone(`Invoice ${invoiceNo(inv)} is already ${money.state === 'credited' ? 'credited in full' : 'paid'}${how}`, inv)
}

/**
 * The office takes money on an invoice: the balance posted to the fleet's account, or money
 * received by check, bank transfer or cash (whole or part, never more than the balance).
 */
export async function recordPayment(invoiceId: string, input: z.output<typeof paymentRecordSchema>, key: string,
  user: User): Promise<PaymentResult> {
  try {
    return await useDb().transaction(async (tx) => {
      const inv = await lockInvoice(tx, invoiceId)
      const [same] = await tx.select().from(tables.payments).where(eq(tables.payments.idempotencyKey, key))
      if (same) {
        const otherAmount = input.amountCents !== undefined && input.amountCents !== same.amountCents
        const differs = same.invoiceId !== invoiceId || same.method !== input.method || otherAmount
        if (differs) ruleError('idempotencyKey', 'This idempotency key was already used for another payment')
        return { paymentId: same.id, replayed: true }
      }
      const money = await requireBalance(tx, inv)
      const [customer] = await tx.select().from(tables.customers).where(eq(tables.customers.id, inv.customerId))
      if (input.method === 'account' && customer?.billingTerms !== 'account') ruleError('method',
        `${customer?.name ?? 'This customer'} has no account with us; send the payment link or record the money received`)
      const amountCents = input.method === 'account' ? money.balanceCents : input.amountCents!
      if (amountCents > money.balanceCents) ruleError('amountCents',
        `More than the balance of ${formatCents(money.balanceCents)}; record only what is owed`)
      if (input.method === 'account') {
        await tx.insert(tables.accountEntries).values({ customerId: inv.customerId, invoiceId, amountCents,
          memo: `Invoice ${invoiceNo(inv)}` })
      }
      const [payment] = await tx.insert(tables.payments).values({
        invoiceId, method: input.method, amountCents, status: input.method === 'account' ? 'posted' : 'recorded',
        reference: METHODS_WITH_REFERENCE.includes(input.method) || input.method === 'cash' ? input.reference : undefined,
        receivedOn: input.receivedOn, note: input.note, idempotencyKey: key, byUserId: user.id,
      }).returning({ id: tables.payments.id })
      await settleInvoiceMoney(tx, inv, user.id,
        `${PAYMENT_METHOD_WORDS[input.method]}: ${formatCents(amountCents)} on invoice ${invoiceNo(inv)}`)
      return { paymentId: payment!.id, replayed: false }
    })
  }
  catch (err) {
    const { code, constraint } = pgErrorOf(err)
    if (code === '23505' && constraint === 'payments_reference_unique') {
      const message = `${input.reference} is already recorded on this invoice`
      throw createError({ status: 409, statusText: 'Conflict', message: `reference: ${message}`, data: { fields: { reference: message } } })
    }
    if (code === '23505' && constraint === 'payments_idempotency_unique') ruleError('idempotencyKey',
      'This idempotency key was already used for another payment')
    throw err
  }
}

export type CardCompletion = {
  eventId: string
  eventType: string
  invoiceId: string | null
  amountCents: number
  currency: string
  /** The payment service's id for the money taken (its payment intent). */
  providerRef: string
  sessionId?: string
}

/**
 * A card payment the payment service reports. Recorded once however often it is delivered; what
 * it counts for is what came in, compared with what is owed: less is a partial payment, and a
 * payment in another currency is held (not counted) for the office to refund.
 */
export async function recordCardPayment(c: CardCompletion): Promise<string> {
  return useDb().transaction(async (tx) => {
    const [fresh] = await tx.insert(tables.paymentEvents).values({ id: c.eventId, type: c.eventType, invoiceId: c.invoiceId,
      outcome: 'received' })
      .onConflictDoNothing().returning({ id: tables.paymentEvents.id })
    if (!fresh) return 'repeat delivery'
    const outcome = await applyCard(tx, c)
    await tx.update(tables.paymentEvents).set({ outcome }).where(eq(tables.paymentEvents.id, c.eventId))
    return outcome
  })
}

async function applyCard(tx: Tx, c: CardCompletion): Promise<string> {
  if (!c.invoiceId) return 'no invoice named'
  const [exists] = await tx.select({ id: tables.invoices.id }).from(tables.invoices).where(eq(tables.invoices.id, c.invoiceId))
  if (!exists) return 'unknown invoice'
  const inv = await lockInvoice(tx, c.invoiceId)
  const currency = useRuntimeConfig().paymentCurrency.toLowerCase()
  const held = c.currency.toLowerCase() !== currency
  const [payment] = await tx.insert(tables.payments).values({
    invoiceId: inv.id, method: 'card', amountCents: c.amountCents, currency: c.currency.toLowerCase(), providerRef: c.providerRef,
    status: held ? 'held' : 'succeeded',
    note: held ? `Paid in ${c.currency.toUpperCase()}, not ${currency.toUpperCase()}: not counted; refund it` : undefined,
  }).onConflictDoNothing({ target: tables.payments.providerRef }).returning({ id: tables.payments.id })
  if (!payment) return 'payment already recorded'
  if (c.sessionId) await tx.update(tables.checkoutSessions).set({ status: 'complete' }).where(eq(tables.checkoutSessions.id, c.sessionId))
  const before = invoiceMoney(inv)
  const { money } = await settleInvoiceMoney(tx, inv, null, `Card payment of ${formatCents(c.amountCents)} on invoice ${invoiceNo(inv)}`)
  if (held) return 'held: wrong currency'
  if (before.balanceCents <= 0) return 'recorded on a settled invoice: refund it'
  return money.balanceCents > 0 ? 'partly paid' : money.balanceCents < 0 ? 'overpaid' : 'paid'
}
