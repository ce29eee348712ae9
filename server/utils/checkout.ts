// Card payments go through the payment service's hosted page; Wayside never sees a card number.
// The payer's link is Wayside's own `/pay/<token>`, which lasts as long as the invoice: it opens
// (or reuses) a checkout session for the balance at that moment, since a session closes within a day.
import { randomBytes, randomUUID } from 'node:crypto'
import { and, desc, eq, gt, sql } from 'drizzle-orm'
import type { InvoiceMoneyInput } from '#shared/utils/invoiceMoney'

/** A session this close to closing is not handed out again; a fresh one is made. */
const REUSE_MARGIN_MS = 30 * 60_000
/** The payment service closes a session after at most a day. */
const SESSION_LIFE_S = 23 * 3600

/** The invoice's pay token, made the first time anyone asks for its link. */
export async function ensurePayToken(invoiceId: string): Promise<string> {
  const db = useDb()
  await db.update(tables.invoices).set({ payToken: randomBytes(24).toString('base64url') })
    .where(and(eq(tables.invoices.id, invoiceId), sql`${tables.invoices.payToken} IS NULL`))
  const [row] = await db.select({ token: tables.invoices.payToken }).from(tables.invoices).where(eq(tables.invoices.id, invoiceId))
  if (!row?.token) throw createError({ status: 404, statusText: 'No such invoice' })
  return row.token
}

export function payUrl(token: string) {
  return `${useRuntimeConfig().siteUrl.replace(/\/$/, '')}/pay/${token}`
}

/** Only an invoice the office has sent is paid through the link, and only while money is due. */
export function payableByLink(inv: InvoiceMoneyInput) {
  return inv.status === 'sent' && invoiceMoney(inv).balanceCents > 0
}

/** What the payer's page shows: enough to know what they pay, nothing else of the account. */
export async function payPageOf(token: string) {
  const [row] = await useDb().select({
    inv: tables.invoices, customerName: tables.customers.name, callNumber: tables.calls.number,
  }).from(tables.invoices)
    .innerJoin(tables.customers, eq(tables.customers.id, tables.invoices.customerId))
    .innerJoin(tables.calls, eq(tables.calls.id, tables.invoices.callId))
    .where(eq(tables.invoices.payToken, token))
  if (!row) throw createError({ status: 404, statusText: 'This payment link is not known; ask the office for a new one' })
  const { inv } = row
  const money = invoiceMoney(inv)
  return {
    invoiceNumber: inv.number, callNumber: row.callNumber, customerName: row.customerName,
    totalCents: inv.totalCents, paidCents: inv.paidCents, creditedCents: inv.creditedCents, balanceCents: money.balanceCents,
    state: money.state, word: money.word, payable: payableByLink(inv), currency: useRuntimeConfig().paymentCurrency,
  }
}

/**
 * The hosted page for the invoice behind `token`: the open session when it is for the balance due
 * now, else a new one after closing the others, so at most one page at a time can take the money.
 * Runs under the invoice lock; the payment service's calls carry idempotency keys.
 */
export async function openCheckout(token: string): Promise<{ url: string }> {
  return useDb().transaction(async (tx) => {
    const [found] = await tx.select({ id: tables.invoices.id }).from(tables.invoices).where(eq(tables.invoices.payToken, token))
    if (!found) throw createError({ status: 404, statusText: 'This payment link is not known; ask the office for a new one' })
    const inv = await lockInvoice(tx, found.id)
    if (!payableByLink(inv)) alreadyDone(`Nothing is due on invoice W-${inv.number} (${invoiceMoney(inv).word.toLowerCase()})`, inv)
    const balance = invoiceMoney(inv).balanceCents
    const currency = useRuntimeConfig().paymentCurrency.toLowerCase()
    const open = await tx.select().from(tables.checkoutSessions)
      .where(and(eq(tables.checkoutSessions.invoiceId, inv.id), eq(tables.checkoutSessions.status, 'open'),
        gt(tables.checkoutSessions.expiresAt, new Date(Date.now() + REUSE_MARGIN_MS))))
      .orderBy(desc(tables.checkoutSessions.createdAt))
    const reuse = open.find(s => s.amountCents === balance && s.currency === currency)
    if (reuse) return { url: reuse.url }
    await closeOpenSessions(tx, inv.id)
    const stripe = useStripe()
    const [call] = await tx.select({ number: tables.calls.number }).from(tables.calls).where(eq(tables.calls.id, inv.callId))
    let session
    try {
      session = await stripe.checkout.sessions.create({
        mode: 'payment',
        line_items: [{ quantity: 1, price_data: { currency, unit_amount: balance,
          product_data: { name: `Invoice W-${inv.number}, road call #${call?.number ?? ''}` } } }],
        success_url: `${payUrl(token)}?done=1`, cancel_url: payUrl(token),
        client_reference_id: inv.id, metadata: { invoiceId: inv.id }, payment_intent_data: { metadata: { invoiceId: inv.id } },
        expires_at: Math.floor(Date.now() / 1000) + SESSION_LIFE_S,
      }, { idempotencyKey: `checkout-${inv.id}-${randomUUID()}` })
    }
    catch (err) {
      console.error('[payments] checkout session not made', (err as Error).message)
      throw createError({ status: 502, statusText: 'The payment service did not answer; try again in a minute' })
    }
    if (!session.url) throw createError({ status: 502, statusText: 'The payment service gave no page to pay on' })
    await tx.insert(tables.checkoutSessions).values({
      id: session.id, invoiceId: inv.id, amountCents: session.amount_total ?? balance, currency: session.currency ?? currency,
      url: session.url, status: 'open', expiresAt: new Date(session.expires_at * 1000),
    })
    return { url: session.url }
  })
}

/** Closes the invoice's open pages at the payment service; one that was just paid stays for its webhook. */
async function closeOpenSessions(tx: Tx, invoiceId: string) {
  const open = await tx.select({ id: tables.checkoutSessions.id }).from(tables.checkoutSessions)
    .where(and(eq(tables.checkoutSessions.invoiceId, invoiceId), eq(tables.checkoutSessions.status, 'open')))
  for (const s of open) {
    const closed = await useStripe().checkout.sessions.expire(s.id).then(r => r.status,
      async () => (await useStripe().checkout.sessions.retrieve(s.id)).status)
    if (closed === 'complete') {
      const message = 'A card payment on this invoice is being confirmed; wait a moment and reload'
      throw createError({ status: 409, statusText: 'Conflict', message, data: { fields: { status: message } } })
    }
    await tx.update(tables.checkoutSessions).set({ status: 'expired' }).where(eq(tables.checkoutSessions.id, s.id))
  }
}

/** The link a mechanic shows the driver for a call, fetched with signal and kept on the phone. */
export async function payLinkForCall(callId: string) {
  const db = useDb()
  const [row] = await db.select({ inv: tables.invoices, terms: tables.customers.billingTerms }).from(tables.invoices)
    .innerJoin(tables.customers, eq(tables.customers.id, tables.invoices.customerId))
    .where(and(eq(tables.invoices.callId, callId), sql`${tables.invoices.status} <> 'void'`))
    .orderBy(desc(tables.invoices.number)).limit(1)
  if (!row) {
    const [c] = await db.select({ terms: tables.customers.billingTerms }).from(tables.calls)
      .innerJoin(tables.customers, eq(tables.customers.id, tables.calls.customerId)).where(eq(tables.calls.id, callId))
    return { state: c?.terms === 'account' ? 'account' as const : 'not_ready' as const }
  }
  const { inv } = row
  if (row.terms === 'account') return { state: 'account' as const }
  const money = invoiceMoney(inv)
  if (inv.status === 'draft') return { state: 'not_ready' as const }
  if (!payableByLink(inv)) return { state: money.balanceCents <= 0 ? 'paid' as const : 'not_ready' as const, invoiceNumber: inv.number }
  return { state: 'due' as const, invoiceNumber: inv.number, amountDueCents: money.balanceCents, url: payUrl(await ensurePayToken(inv.id)) }
}
