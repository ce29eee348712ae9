import { z } from 'zod'
import { centsSchema } from './money'
import { cleanText } from './text'

export const INVOICE_STATUSES = ['draft', 'sent', 'paid', 'void'] as const
export type InvoiceStatus = (typeof INVOICE_STATUSES)[number]

export const invoiceCreateSchema = z.object({
  callId: z.string({ message: 'Pick a call' }).uuid('Not a valid call id'),
})

const reason = cleanText('Reason', { multiline: true, missing: 'Say why' }).min(3, 'Say why, in a few words')
  .max(300, 'Keep the reason under 300 characters')
const quantity = z.number({ message: 'Quantity must be a number' }).positive('Quantity must be above zero')
  .max(10_000, 'Quantity is too large')
const unitCents = centsSchema('Unit price', { max: 10_000_000 })
const description = cleanText('Description', { missing: 'Describe the line' }).min(2, 'Describe the line')
  .max(200, 'Keep the description under 200 characters')
const lineKey = cleanText('Line', { missing: 'Name the line' }).min(1, 'Name the line').max(80)

/** Kinds of line the office may add by hand. */
export const OFFICE_LINE_KINDS = ['labor', 'travel', 'part', 'fee'] as const

/** One change by the office to a draft invoice, with its reason (POST /api/invoices/[id]/adjustments). */
export const invoiceAdjustmentSchema = z.discriminatedUnion('action', [
  z.object({
    action: z.literal('add'), reason,
    line: z.object({
      kind: z.enum(OFFICE_LINE_KINDS, { message: 'Choose the kind of line' }), description, quantity, unitCents, taxable: z.boolean(),
    }),
  }),
  z.object({
    action: z.literal('change'), key: lineKey, reason,
    changes: z.object({ description, quantity, unitCents, taxable: z.boolean() }).partial()
      .refine(c => Object.keys(c).length > 0, 'Change at least one thing'),
  }),
  z.object({ action: z.literal('remove'), key: lineKey, reason }),
  z.object({
    action: z.literal('road'), reason,
    distance: z.number({ message: 'Distance must be a number' }).min(0, 'Distance cannot be negative')
      .max(5000, 'Distance is too large').nullable(),
  }),
], { message: 'Say whether to add, change or remove a line' })
export type InvoiceAdjustmentInput = z.infer<typeof invoiceAdjustmentSchema>

export const invoiceListQuerySchema = z.object({
  status: z.enum(INVOICE_STATUSES, { message: 'Unknown invoice status' }).optional(),
  customerId: z.string().uuid('Not a valid customer id').optional(),
  page: z.coerce.number({ message: 'Page must be a number' }).int().min(1).default(1),
  pageSize: z.coerce.number({ message: 'Page size must be a number' }).int().min(1).max(200).default(50),
})

/** The office marks a call's photo for the customer: it then prints on the invoice (PATCH /api/photos/[id]). */
export const photoMarkSchema = z.object({ showCustomer: z.boolean({ message: 'Say whether the customer sees this photo' }) })
