import { z } from 'zod'
import { centsSchema } from './money'
import { optText, recordId, versionField } from './fields'

// Service trucks and what they carry: one schema per payload, used by the admin's forms and the
// routes alike. On hand changes only through a count or a transfer, each with its reason.

const cents = (label: string) => centsSchema(label)
const amount = (label: string) => z.number({ message: `${label} must be a number` })
  .min(0, `${label} cannot be negative`).max(100_000, `${label} is too large`)
  .refine(v => Number.isInteger(v * 100), `${label}: at most two decimals`)
const reason = z.string({ message: 'Say why (kept in the stock log)' }).trim()
  .min(3, 'Say why (kept in the stock log)').max(300, 'Keep the reason under 300 characters')

export const truckCreateSchema = z.object({
  name: z.string({ message: 'Name the truck' }).trim().min(1, 'Name the truck').max(60, 'Keep the name under 60 characters'),
  plate: optText(20, 'Plate'),
  /** The mechanic whose home truck this is (their people record changes with it). */
  mechanicId: recordId('a mechanic').nullable().optional(),
})

export const truckPatchSchema = truckCreateSchema.partial().extend({
  active: z.boolean({ message: 'Say whether the truck is in service' }).optional(),
  version: versionField,
})

export const stockLineCreateSchema = z.object({
  partNumber: z.string({ message: 'Enter the part number' }).trim().min(1, 'Enter the part number')
    .max(40, 'Keep the part number under 40 characters'),
  description: z.string({ message: 'Describe the part' }).trim().min(1, 'Describe the part').max(200, 'Keep it under 200 characters'),
  bin: optText(20, 'Bin'),
  onHand: amount('On hand'),
  minimum: amount('Minimum'),
  costCents: cents('Cost'),
  unitPriceCents: cents('Price'),
  coreChargeCents: cents('Core charge'),
})

/** Everything but on hand, which only a count or a transfer changes. */
export const stockLinePatchSchema = stockLineCreateSchema.omit({ partNumber: true, onHand: true }).partial()
  .extend({ version: versionField })
  .refine(v => Object.keys(v).some(k => k !== 'version'), { message: 'Nothing to change', path: ['_'] })

export const stockCountSchema = z.object({
  counted: amount('Counted'),
  reason,
})

export const stockTransferSchema = z.object({
  fromStockId: recordId('the part to move'),
  toTruckId: recordId('the truck it goes to'),
  quantity: amount('Quantity').refine(v => v > 0, 'Move at least some'),
  reason,
})

export const restockQuerySchema = z.object({
  truckId: z.string().uuid('Not a valid truck id').optional(),
})

export type TruckCreateInput = z.input<typeof truckCreateSchema>
export type TruckPatchInput = z.input<typeof truckPatchSchema>
export type StockLineCreateInput = z.input<typeof stockLineCreateSchema>
export type StockLinePatchInput = z.input<typeof stockLinePatchSchema>
export type StockCountInput = z.input<typeof stockCountSchema>
export type StockTransferInput = z.input<typeof stockTransferSchema>

export const truckListQuerySchema = z.object({
  /** Admin only: trucks out of service too. */
  all: z.enum(['true', 'false'], { message: 'all is true or false' }).optional().transform(v => v === 'true'),
})
