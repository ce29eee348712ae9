import { z } from 'zod'
import { cleanText } from './text'

export const INVOICE_STATUSES = ['draft', 'sent', 'paid', 'void'] as const
export type InvoiceStatus = (typeof INVOICE_STATUSES)[number]

export const invoiceCreateSchema = z.object({
  callId: z.string({ message: 'Pick a call' }).uuid('Not a valid call id'),
})

export const invoiceListQuerySchema = z.object({
  status: z.enum(INVOICE_STATUSES, { message: 'Unknown invoice status' }).optional(),
  customerId: z.string().uuid('Not a valid customer id').optional(),
  page: z.coerce.number({ message: 'Page must be a number' }).int().min(1).default(1),
  pageSize: z.coerce.number({ message: 'Page size must be a number' }).int().min(1).max(200).default(50),
})

/**
 * Taking payment. Card: the payment method id the card reader or saved card gave (the payment
 * service's own reference). Account: charged to the fleet's running account.
 */
export const invoicePaySchema = z.object({
  method: z.enum(['card', 'account'], { message: 'Choose card or account' }),
  paymentMethod: cleanText('Payment method reference').min(3, 'Enter the payment method reference').max(100).optional(),
}).refine(v => v.method !== 'card' || !!v.paymentMethod, { message: 'Enter the payment method reference', path: ['paymentMethod'] })

export type InvoicePayInput = z.infer<typeof invoicePaySchema>
