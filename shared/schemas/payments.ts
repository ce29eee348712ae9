import { z } from 'zod'
import { centsSchema } from './money'
import { cleanText } from './text'

/** Ways the office takes money on an invoice. Cards never: the payer uses the payment page. */
export const OFFICE_PAYMENT_METHODS = ['account', 'check', 'bank_transfer', 'cash'] as const
export type OfficePaymentMethod = (typeof OFFICE_PAYMENT_METHODS)[number]
export const PAYMENT_METHOD_WORDS: Record<OfficePaymentMethod | 'card', string> = {
  card: 'Card (payment page)',
  account: 'Charge to the fleet\'s account',
  check: 'Check',
  bank_transfer: 'Bank transfer',
  cash: 'Cash',
}
/** Methods whose money the office finds again by a reference (check number, transfer id). */
export const METHODS_WITH_REFERENCE: readonly OfficePaymentMethod[] = ['check', 'bank_transfer']

/** One key per intent to pay: the office's page makes one per click, a retry resends it. */
export const idempotencyKeySchema = z.string({ message: 'Send an idempotency key (Idempotency-Key header or idempotencyKey field)' })
  .trim().min(8, 'The idempotency key is too short (8 characters at least)').max(200, 'The idempotency key is too long')
  .regex(/^[\w:.-]+$/, 'The idempotency key may hold letters, digits and - _ : . only')

const cents = (what: string) => centsSchema(what, { positive: true, kind: 'a number of cents' })

/**
 * Money the office takes on an invoice. `account` posts the whole balance to the fleet's account;
 * the others record money already received, whole or in part.
 */
export const paymentRecordSchema = z.object({
  method: z.enum(OFFICE_PAYMENT_METHODS,
    { message: 'Choose account, check, bank transfer or cash; a card is paid by the payer on the payment page' }),
  amountCents: cents('The amount').optional(),
  reference: cleanText('Reference').max(100, 'Keep the reference under 100 characters').optional()
    .transform(v => (v ? v : undefined)),
  receivedOn: z.iso.date({ message: 'Give the date as YYYY-MM-DD' }).optional(),
  note: cleanText('Note', { multiline: true }).max(500, 'Keep the note under 500 characters').optional(),
  idempotencyKey: idempotencyKeySchema.optional(),
}).superRefine((v, ctx) => {
  if (v.method !== 'account' && v.amountCents === undefined) ctx.addIssue({ code: 'custom', path: ['amountCents'],
    message: 'Enter the amount received' })
  if (METHODS_WITH_REFERENCE.includes(v.method) && !v.reference) {
    ctx.addIssue({ code: 'custom', path: ['reference'],
      message: v.method === 'check' ? 'Enter the check number' : 'Enter the transfer reference' })
  }
})
export type PaymentRecordInput = z.input<typeof paymentRecordSchema>

export const refundSchema = z.object({
  paymentId: z.string({ message: 'Pick the payment to refund' }).uuid('Not a valid payment id'),
  amountCents: cents('The refund'),
  reason: z.string({ message: 'Say why the money goes back' }).trim().min(3, 'Say why the money goes back').max(500),
  idempotencyKey: idempotencyKeySchema.optional(),
})
export type RefundInput = z.input<typeof refundSchema>

/** A credit note's lines are typed as the amount to take off; they are stored negative. */
export const creditNoteSchema = z.object({
  reason: z.string({ message: 'Say what the credit note corrects' }).trim().min(3, 'Say what the credit note corrects').max(500),
  lines: z.array(z.object({
    description: z.string({ message: 'Describe the line' }).trim().min(2, 'Describe the line').max(200),
    amountCents: cents('The amount to credit'),
    taxable: z.boolean({ message: 'Say whether the line was taxed' }),
  }), { message: 'Add at least one line' }).min(1, 'Add at least one line').max(50, 'At most 50 lines'),
  idempotencyKey: idempotencyKeySchema.optional(),
})
export type CreditNoteInput = z.input<typeof creditNoteSchema>

/** The payer's link token, as made by the server (24 random bytes, base64url). */
export const payTokenParamsSchema = z.object({
  token: z.string({ message: 'No payment link given' }).regex(/^[\w-]{20,64}$/, 'Not a payment link Wayside made'),
})

export const payLinkQuerySchema = z.object({
  callId: z.string({ message: 'Name the call' }).uuid('Not a valid call id'),
})
