// Form state for customers and units: what the boxes hold (text), and the API input it becomes.
import type { CustomerCreateInput } from '#shared/schemas/customers'
import type { UnitDraftInput } from '#shared/schemas/units'

export type CustomerDraft = {
  name: string
  kind: 'fleet' | 'owner_operator'
  billingTerms: 'card' | 'account'
  netDays: string
  billingEmail: string
  phone: string
  taxExempt: boolean
  notes: string
}
export type UnitDraft = {
  unitNumber: string
  vin: string
  vinOverrideReason: string
  yearMakeModel: string
  engine: string
  odometer: string
  odometerUnit: 'km' | 'mi'
  engineHours: string
  notes: string
}

export const blankCustomer = (name = ''): CustomerDraft => ({
  name, kind: 'fleet', billingTerms: 'card', netDays: '', billingEmail: '', phone: '', taxExempt: false, notes: '',
})
export const blankUnit = (unitNumber = ''): UnitDraft => ({
  unitNumber, vin: '', vinOverrideReason: '', yearMakeModel: '', engine: '', odometer: '', odometerUnit: 'km', engineHours: '', notes: '',
})

export function customerInput(d: CustomerDraft): CustomerCreateInput {
  return { ...d, netDays: d.billingTerms === 'account' ? numberFromText(d.netDays) : null }
}
export function unitInput(d: UnitDraft): UnitDraftInput {
  return { ...d, odometer: numberFromText(d.odometer), engineHours: numberFromText(d.engineHours) }
}

type CustomerRow = {
  name: string
  kind: string
  billingTerms: 'card' | 'account'
  netDays: number | null
  billingEmail: string | null
  phone: string | null
  taxExempt: boolean
  notes: string | null
}
export function customerDraftOf(c: CustomerRow): CustomerDraft {
  return {
    name: c.name, kind: c.kind === 'owner_operator' ? 'owner_operator' : 'fleet', billingTerms: c.billingTerms,
    netDays: c.netDays === null ? '' : String(c.netDays),
    billingEmail: c.billingEmail ?? '', phone: c.phone ?? '', taxExempt: c.taxExempt, notes: c.notes ?? '',
  }
}
type UnitRow = {
  unitNumber: string
  vin: string | null
  vinOverrideReason: string | null
  yearMakeModel: string | null
  engine: string | null
  odometer: number | null
  odometerUnit: string
  engineHours: number | null
  notes: string | null
}
export function unitDraftOf(u: UnitRow): UnitDraft {
  return {
    unitNumber: u.unitNumber, vin: u.vin ?? '', vinOverrideReason: u.vinOverrideReason ?? '',
    yearMakeModel: u.yearMakeModel ?? '', engine: u.engine ?? '',
    odometer: u.odometer === null ? '' : String(u.odometer), odometerUnit: u.odometerUnit === 'mi' ? 'mi' : 'km',
    engineHours: u.engineHours === null ? '' : String(u.engineHours), notes: u.notes ?? '',
  }
}

/** Errors under `prefix.` (e.g. 'newUnit.vin') re-keyed without it, for a nested form part. */
export function errorsUnder(errors: Record<string, string>, prefix: string): Record<string, string> {
  if (!prefix) return errors
  const out: Record<string, string> = {}
  for (const [k, v] of Object.entries(errors)) if (k.startsWith(`${prefix}.`)) out[k.slice(prefix.length + 1)] = v
  return out
}
