import { z } from 'zod'
import { optInt, optText, pageQuery, versionField } from './fields'
import { cleanText, requiredText } from './text'

export const CUSTOMER_KINDS = ['fleet', 'owner_operator'] as const
export const BILLING_TERMS = ['card', 'account'] as const
export const CUSTOMER_KIND_LABELS: Record<(typeof CUSTOMER_KINDS)[number], string> = { fleet: 'Fleet', owner_operator: 'Owner-operator' }

const email = cleanText('Billing e-mail').toLowerCase().max(200, 'Billing e-mail is too long')
  .refine(v => v === '' || z.email().safeParse(v).success, 'Enter an e-mail address like ap@fleet.example')
  .nullable().optional().transform(v => (v === '' ? null : v))

const customerFields = {
  name: requiredText(160, 'Name', { missing: 'Enter the customer name' }),
  kind: z.enum(CUSTOMER_KINDS, { message: 'Pick fleet or owner-operator' }),
  billingTerms: z.enum(BILLING_TERMS, { message: 'Pick card or account' }),
  netDays: optInt(0, 180, 'Net days'),
  billingEmail: email,
  phone: optText(40, 'Phone'),
  taxExempt: z.boolean({ message: 'Tax-exempt must be yes or no' }),
  notes: optText(2000, 'Notes', { multiline: true }),
}

// An account customer pays within net days; a card customer pays at the time, so no net days.
function termsRule(v: { billingTerms?: string, netDays?: number | null }, ctx: z.RefinementCtx) {
  if (v.billingTerms === 'account' && (v.netDays === null || v.netDays === undefined)) {
    ctx.addIssue({ code: 'custom', path: ['netDays'], message: 'An account customer needs net days (0 for due on receipt)' })
  }
}

export const customerCreateSchema = z.object({
  ...customerFields,
  kind: customerFields.kind.default('fleet'),
  taxExempt: customerFields.taxExempt.default(false),
}).superRefine(termsRule).transform(v => ({ ...v, netDays: v.billingTerms === 'card' ? null : v.netDays ?? null }))

export const customerPatchSchema = z.object({
  name: customerFields.name.optional(),
  kind: customerFields.kind.optional(),
  billingTerms: customerFields.billingTerms.optional(),
  netDays: customerFields.netDays,
  billingEmail: customerFields.billingEmail,
  phone: customerFields.phone,
  taxExempt: customerFields.taxExempt.optional(),
  notes: customerFields.notes,
  version: versionField,
}).superRefine(termsRule)

export const customerListQuerySchema = z.object({
  ...pageQuery,
  sort: z.enum(['name', 'kind', 'billingTerms', 'createdAt', 'openCalls']).optional(),
})

export const siteCreateSchema = z.object({
  name: requiredText(120, 'Name', { missing: 'Name the place' }),
  address: optText(300, 'Address'),
  lat: z.number({ message: 'Latitude must be a number' }).min(-90, 'Latitude is from -90 to 90').max(90, 'Latitude is from -90 to 90'),
  lon: z.number({ message: 'Longitude must be a number' })
    .min(-180, 'Longitude is from -180 to 180').max(180, 'Longitude is from -180 to 180'),
})

export type CustomerCreateInput = z.input<typeof customerCreateSchema>
export type CustomerPatchInput = z.input<typeof customerPatchSchema>
export type SiteCreateInput = z.input<typeof siteCreateSchema>
