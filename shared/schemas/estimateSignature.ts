// A card customer's driver signs the roadside estimate before the work starts: the work in a line,
// the labor and parts expected, the priced lines and tax as the driver saw them, the total, the
// name and the drawn signature. One schema for the phone's form, the device's op check and the sync.
import { z } from 'zod'
import { APPROVAL_MAX_CENTS, plannedPartSchema } from './approvals'
import { signOffCreateSchema } from './syncRecords'
import { requiredText } from './text'

const cents = (label: string, min = 0) => z.number({ message: `${label} must be an amount in cents` })
  .int(`${label} must be whole cents`).min(min, `${label} cannot be negative`).max(APPROVAL_MAX_CENTS, `${label} is too large`)

/** A priced line as the driver saw it on the phone. */
export const signedLineSchema = z.object({
  description: requiredText(300, 'Line description'),
  // A line may take money off (a minimum already met is priced at 0; a credit below 0).
  amountCents: cents('Line amount', -APPROVAL_MAX_CENTS),
  /** Work still to be done (the plan), not yet on the clock or the parts list. */
  planned: z.boolean().default(false),
})
export type SignedLine = z.output<typeof signedLineSchema>

const so = signOffCreateSchema.shape

/** The `estimateSignature` create op. */
export const estimateSignatureCreateSchema = z.object({
  callId: z.string().uuid('Not a valid call id'),
  driverName: so.driverName,
  signature: so.signature,
  /** What will be done, in a line. */
  work: requiredText(300, 'What will be done'),
  plannedLaborMinutes: z.number({ message: 'Labor expected must be minutes' }).int('Whole minutes')
    .min(0, 'Cannot be negative').max(7 * 24 * 60, 'At most a week'),
  plannedParts: z.array(plannedPartSchema, { message: 'Expected a list of parts' }).max(50, 'At most 50 parts').default([]),
  lines: z.array(signedLineSchema, { message: 'Expected the estimate\'s lines' }).min(1, 'The estimate has no lines')
    .max(100, 'At most 100 lines'),
  taxCents: cents('The tax'),
  amountCents: cents('The amount'),
}).superRefine((v, ctx) => {
  const sum = v.lines.reduce((s, l) => s + l.amountCents, 0) + v.taxCents
  if (sum !== v.amountCents) {
    ctx.addIssue({ code: 'custom', path: ['amountCents'], message: 'The amount is not the lines and the tax added up' })
  }
})
export type EstimateSignatureCreate = z.output<typeof estimateSignatureCreateSchema>
