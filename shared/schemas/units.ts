import { z } from 'zod'
import { vinProblem } from '../utils/vin'
import { optInt, optText, pageQuery, recordId, versionField } from './fields'
import { cleanText, requiredText } from './text'
import { ENGINE_HOURS_MAX, ODOMETER_MAX } from './truckReadings'

export const ODOMETER_UNITS = ['km', 'mi'] as const

const vinField = cleanText('VIN').toUpperCase().max(40, 'A VIN has 17 characters')
  .nullable().optional().transform(v => (v === '' ? null : v))

const unitFields = {
  unitNumber: requiredText(40, 'Unit number', { missing: 'Enter the customer\'s unit number' }),
  vin: vinField,
  vinOverrideReason: optText(300, 'The reason'),
  yearMakeModel: optText(120, 'Year, make and model'),
  engine: optText(120, 'Engine'),
  odometer: optInt(0, ODOMETER_MAX, 'Odometer'),
  odometerUnit: z.enum(ODOMETER_UNITS, { message: 'Odometer is in km or mi' }),
  engineHours: z.number({ message: 'Engine hours must be a number' })
    .min(0, 'Engine hours cannot be below 0').max(ENGINE_HOURS_MAX, `Engine hours cannot be above ${ENGINE_HOURS_MAX}`)
    .nullable().optional(),
  notes: optText(2000, 'Notes', { multiline: true }),
}

/**
 * The VIN rule (49 CFR 565): a wrong length or a character a VIN never holds is an error; a wrong
 * check digit is a warning the dispatcher may keep by saying why (older and non-North-American
 * VINs often carry none). A reason given for a VIN that checks out is dropped.
 */
function vinRule(v: { vin?: string | null, vinOverrideReason?: string | null }, ctx: z.RefinementCtx) {
  if (!v.vin) return
  const p = vinProblem(v.vin)
  if (!p) return
  if (p.kind !== 'check_digit') ctx.addIssue({ code: 'custom', path: ['vin'], message: p.reason })
  else if (!v.vinOverrideReason || v.vinOverrideReason.length < 3) {
    ctx.addIssue({
      code: 'custom', path: ['vin'],
      message: `${p.reason}. If the VIN on the truck really reads so, say why in "Keep this VIN because"`,
    })
  }
}
function dropNeedlessReason<T extends { vin?: string | null, vinOverrideReason?: string | null }>(v: T): T {
  if (v.vin !== undefined && (!v.vin || vinProblem(v.vin)?.kind !== 'check_digit')) return { ...v, vinOverrideReason: null }
  return v
}

/** A new unit without its customer, as taken inline with a call. */
export const unitDraftSchema = z.object({ ...unitFields, odometerUnit: unitFields.odometerUnit.default('km') })
  .superRefine(vinRule).transform(dropNeedlessReason)

export const unitCreateSchema = z.object({
  customerId: recordId('the customer'), ...unitFields, odometerUnit: unitFields.odometerUnit.default('km'),
})
  .superRefine(vinRule).transform(dropNeedlessReason)

export const unitPatchSchema = z.object({
  customerId: recordId('the customer').optional(),
  unitNumber: unitFields.unitNumber.optional(),
  vin: unitFields.vin,
  vinOverrideReason: unitFields.vinOverrideReason,
  yearMakeModel: unitFields.yearMakeModel,
  engine: unitFields.engine,
  odometer: unitFields.odometer,
  odometerUnit: unitFields.odometerUnit.optional(),
  engineHours: unitFields.engineHours,
  notes: unitFields.notes,
  version: versionField,
}).superRefine(vinRule).transform(dropNeedlessReason)

export const unitListQuerySchema = z.object({
  ...pageQuery,
  customerId: z.string().uuid('Not a valid customer id').optional(),
  sort: z.enum(['unitNumber', 'customer', 'yearMakeModel', 'odometer', 'lastCall']).optional(),
})

/** Query of GET /api/units/[id]: `before`, the answer's `moreCalls`, asks for older calls. */
export const unitHistoryQuerySchema = z.object({
  before: z.string().max(200, 'before: not a cursor this unit page gave').optional(),
})

export type UnitDraftInput = z.input<typeof unitDraftSchema>
export type UnitCreateInput = z.input<typeof unitCreateSchema>
export type UnitPatchInput = z.input<typeof unitPatchSchema>
