// Money given back on a payment. A card refund goes through the payment service with the intent's
// key, so a retry after a lost answer (or a failed commit here) gets the same refund back there
// instead of a second one; money paid another way is given back by hand and recorded.
import { and, eq, sql } from 'drizzle-orm'
import type { z } from 'zod'
import type { User } from '#auth-utils'
import type { refundSchema } from '#shared/schemas/payments'

export async function refundPayment(invoiceId: string, input: z.output<typeof refundSchema>, key: string, user: User) {
  return useDb().transaction(async (tx) => {
    const inv = await lockInvoice(tx, invoiceId)
    const [same] = await tx.select().from(tables.refunds).where(eq(tables.refunds.idempotencyKey, key))
    if (same) {
      if (same.paymentId !== input.paymentId || same.amountCents !== input.amountCents) ruleError('idempotencyKey',
        'This idempotency key was already used for another refund')
      return { refundId: same.id, replayed: true }
    }
    const [payment] = await tx.select().from(tables.payments).where(and(eq(tables.payments.id, input.paymentId),
      eq(tables.payments.invoiceId, inv.id)))
    if (!payment) ruleError('paymentId', 'No such payment on this invoice')
    const [done] = await tx.select({ n: sql<number>`coalesce(sum(${tables.refunds.amountCents}), 0)::int` }).from(tables.refunds)
      .where(eq(tables.refunds.paymentId, payment.id))
    const left = payment.amountCents - (done?.n ?? 0)
    if (input.amountCents > left) ruleError('amountCents',
      left > 0 ? `At most ${formatCents(left)} is left to refund on this payment` : 'This payment is refunded in full')
    let providerRef: string | null = null
    if (payment.method === 'card') {
      try {
        const refund = await useStripe().refunds.create({ payment_intent: payment.providerRef!, amount: input.amountCents,
          metadata: { invoiceId: inv.id } }, { idempotencyKey: `refund-${key}` })
        providerRef = refund.id
      }
      catch (err) {
        console.error('[payments] refund refused', (err as Error).message)
        throw createError({ status: 502, statusText: 'The payment service did not make the refund; nothing changed' })
      }
    }
    if (payment.method === 'account') {
      await tx.insert(tables.accountEntries).values({ customerId: inv.customerId, invoiceId: inv.id, amountCents: -input.amountCents,
        memo: `Refund on invoice W-${inv.number}: ${input.reason}` })
    }
    const [row] = await tx.insert(tables.refunds).values({
      paymentId: payment.id, invoiceId: inv.id, amountCents: input.amountCents, reason: input.reason, providerRef,
      idempotencyKey: key, byUserId: user.id,
    }).returning({ id: tables.refunds.id })
    await settleInvoiceMoney(tx, inv, user.id, `Refund of ${formatCents(input.amountCents)} on invoice W-${inv.number}: ${input.reason}`)
    return { refundId: row!.id, replayed: false }
  })
}
