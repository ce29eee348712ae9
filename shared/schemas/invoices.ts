import { z } from 'zod'

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
