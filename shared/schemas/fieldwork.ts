// The phone's forms, built on the protocol's own schemas (shared/schemas/sync.ts): each field is
// the wire's, with only what a keypad needs laid on top (a decimal comma, an empty box meaning
// none, dollars typed for cents). What the form accepts the server accepts; the device checks the
// whole op against the wire schema again before it is queued.
import { z } from 'zod'
import { cleanText } from './text'
import { approvalRequestCreateSchema, plannedPartSchema } from './approvals'
import { estimateSignatureCreateSchema } from './estimateSignature'
import { parseDtc } from '../utils/dtc'
import { specBounds } from '../utils/spec'
import {
  READING_QUANTITIES, callFieldSchemas, faultCodeCreateSchema, judgeSpecSchema, noteCreateSchema, partLineCreateSchema,
  readingCreateSchema, signOffCreateSchema,
} from './sync'

export { READING_QUANTITIES }
export type ReadingQuantity = (typeof READING_QUANTITIES)[number]

/** Units offered per quantity, printed as the trade writes them. */
export const UNITS_FOR: Record<ReadingQuantity, string[]> = {
  resistance: ['ohm', 'kohm'],
  voltage: ['V', 'mV'],
  temperature: ['degC', 'degF'],
  pressure: ['kPa', 'psi', 'bar'],
  concentration: ['%'],
  other: ['A', 'Hz', 'rpm', '%', 'mm', 'L'],
}

/** A number typed on a phone keypad: '' means none, a comma counts as a decimal point. */
export function keypadNumber(v: unknown): unknown {
  if (typeof v !== 'string') return v
  return v.trim() === '' ? undefined : Number(v.trim().replace(',', '.'))
}

/** A keypad box read as the wire's number; `label` names it when it is not one (or is missing and required). */
export function keypad<T extends z.ZodType>(wire: T, label: string) {
  const optional = wire.safeParse(undefined).success
  return z.preprocess((v, ctx) => {
    const n = keypadNumber(v)
    if ((n === undefined && !optional) || (typeof n === 'number' && Number.isNaN(n))) {
      ctx.addIssue({ code: 'custom', message: `${label} must be a number` })
      return z.NEVER
    }
    return n
  }, wire)
}

/** An empty box is no value (not an empty string). */
const blank = <T extends z.ZodType>(wire: T) => z.preprocess(v => (typeof v === 'string' && !v.trim() ? undefined : v), wire)

/** A price typed in dollars, carried in the wire's cents; `max` is the wire's limit in cents. */
function dollars(wire: z.ZodType, label: string, max: number) {
  return z.preprocess((v, ctx) => {
    const n = keypadNumber(v)
    if (n === undefined) return undefined
    if (typeof n !== 'number' || Number.isNaN(n)) {
      ctx.addIssue({ code: 'custom', message: `${label} must be a number` })
      return z.NEVER
    }
    const cents = Math.round(n * 100)
    if (!wire.safeParse(cents).success) {
      ctx.addIssue({ code: 'custom', message: `${label} must be from 0.00 to ${(max / 100).toFixed(2)}` })
      return z.NEVER
    }
    return cents
  }, wire)
}

const rd = readingCreateSchema.shape
const spec = judgeSpecSchema.shape
export const readingSpecSchema = z.object({
  min: keypad(spec.min, 'Spec low limit'),
  max: keypad(spec.max, 'Spec high limit'),
  nominal: keypad(spec.nominal, 'Spec nominal'),
  tolerance: keypad(spec.tolerance, 'Spec tolerance'),
  tolerancePct: keypad(spec.tolerancePct, 'Spec tolerance %'),
}).transform(s => Object.fromEntries(Object.entries(s).filter(([, v]) => v !== undefined)) as Record<string, number>)
  .superRefine((s, ctx) => {
    if (!Object.keys(s).length) return
    try { specBounds(s) }
    catch (err) { ctx.addIssue({ code: 'custom', message: err instanceof Error ? err.message : 'Spec is not valid' }) }
  })

export const readingInputSchema = z.object({
  label: rd.label,
  quantity: rd.quantity,
  value: keypad(rd.value, 'Value'),
  unit: rd.unit,
  component: blank(rd.component),
  pins: blank(rd.pins),
  conditions: blank(rd.conditions),
  spec: readingSpecSchema.optional(),
})
export type ReadingInput = z.input<typeof readingInputSchema>

const fc = faultCodeCreateSchema.in.shape
/** Either form of a fault code; the J2012 text is read by the same parser the server uses. */
export const faultCodeInputSchema = z.object({
  form: z.enum(['j2012', 'j1939']),
  code: z.string().optional(),
  spn: keypad(fc.spn, 'SPN'),
  fmi: keypad(fc.fmi, 'FMI'),
  state: fc.state.unwrap().unwrap(),
  count: keypad(fc.count, 'Count'),
}).superRefine((v, ctx) => {
  if (v.form === 'j2012') {
    try { parseDtc(v.code ?? '') }
    catch (err) { ctx.addIssue({ code: 'custom', path: ['code'], message: err instanceof Error ? err.message : 'Not a fault code' }) }
    return
  }
  if (v.spn === undefined || v.spn === null) ctx.addIssue({ code: 'custom', path: ['spn'], message: 'A J1939 fault code needs an SPN' })
  if (v.fmi === undefined || v.fmi === null) ctx.addIssue({ code: 'custom', path: ['fmi'], message: 'A J1939 fault code needs an FMI' })
}).transform(v => (v.form === 'j2012'
  ? { code: parseDtc(v.code ?? '').code, state: v.state, count: v.count ?? undefined }
  : { spn: v.spn as number, fmi: v.fmi as number, state: v.state, count: v.count ?? undefined }))

export const noteInputSchema = z.object({ text: noteCreateSchema.shape.text })

const pl = partLineCreateSchema.shape
export const partLineInputSchema = z.object({
  partNumber: pl.partNumber,
  description: pl.description,
  quantity: keypad(pl.quantity, 'Quantity'),
  unitPrice: dollars(pl.unitPriceCents, 'Unit price', pl.unitPriceCents.unwrap().maxValue ?? 0),
  corePrice: dollars(pl.coreChargeCents, 'Core charge', pl.coreChargeCents.unwrap().maxValue ?? 0),
  serviceTruckId: pl.serviceTruckId.optional(),
}).transform(({ unitPrice, corePrice, ...p }) => ({ ...p, unitPriceCents: unitPrice ?? 0, coreChargeCents: corePrice ?? 0 }))

export const storyInputSchema = z.object({
  storyComplaint: callFieldSchemas.storyComplaint,
  storyCause: callFieldSchemas.storyCause,
  storyCorrection: callFieldSchemas.storyCorrection,
})

const so = signOffCreateSchema.shape
export const signOffInputSchema = z.object({
  driverName: so.driverName,
  // An empty pad gives no image at all: say what to do rather than what the wire expected.
  signature: z.preprocess((v, ctx) => {
    if (typeof v === 'string' && v) return v
    ctx.addIssue({ code: 'custom', message: 'The driver signs in the box first' })
    return z.NEVER
  }, so.signature),
})

/** The test drive and the checks after the repair, kept in the call's `verification` field. */
export const verificationInputSchema = z.object({
  codesCleared: z.boolean(),
  liveValuesChecked: z.boolean(),
  liveValuesNote: blank(cleanText('Live values note', { multiline: true })
    .max(500, 'At most 500 characters').optional()),
  testDriveKm: keypad(
    z.number().min(0, 'Distance cannot be negative').max(2000, 'Distance is too large').optional(), 'Test drive distance',
  ),
  testDriveMinutes: keypad(z.number().min(0, 'Time cannot be negative').max(1440, 'Time is too long').optional(), 'Test drive time'),
  lampsOff: z.boolean(),
  derateGone: z.boolean(),
})
export type VerificationInput = z.input<typeof verificationInputSchema>

export const followUpInputSchema = z.object({
  followUp: callFieldSchemas.followUp.unwrap().min(1, 'Say what still needs doing'),
})

/** Asking the fleet for more: the labor still needed typed in hours, carried in minutes. */
export const approvalRequestInputSchema = z.object({
  diagnosis: approvalRequestCreateSchema.shape.diagnosis,
  needed: approvalRequestCreateSchema.shape.needed,
  laborHours: keypad(z.number({ message: 'Labor still needed must be hours' }).min(0, 'Cannot be negative').max(168, 'At most 168 hours')
    .optional(), 'Labor still needed'),
}).transform(({ laborHours, ...r }) => ({ ...r, plannedLaborMinutes: Math.round((laborHours ?? 0) * 60) }))

/** A part still needed, as the request form takes it (price in dollars). */
export const approvalPartInputSchema = z.object({
  partNumber: plannedPartSchema.shape.partNumber,
  description: plannedPartSchema.shape.description,
  quantity: keypad(plannedPartSchema.shape.quantity, 'Quantity'),
  unitPrice: dollars(pl.unitPriceCents, 'Unit price', pl.unitPriceCents.unwrap().maxValue ?? 0),
}).transform(({ unitPrice, ...p }) => ({ ...p, unitPriceCents: Number(unitPrice ?? 0), coreChargeCents: 0 }))

/** The estimate a card customer's driver signs: the work in a line and the labor expected in hours, carried in minutes. */
export const estimatePlanInputSchema = z.object({
  work: estimateSignatureCreateSchema.shape.work,
  laborHours: keypad(z.number({ message: 'Labor expected must be hours' }).min(0, 'Cannot be negative').max(168, 'At most 168 hours')
    .optional(), 'Labor expected'),
}).transform(({ laborHours, ...r }) => ({ ...r, plannedLaborMinutes: Math.round((laborHours ?? 0) * 60) }))

/** The odometer and engine hours typed at the truck; an empty box is no reading (null on the call). */
export const truckReadingsInputSchema = z.object({
  odometerReading: keypad(callFieldSchemas.odometerReading.optional(), 'Odometer'),
  engineHoursReading: keypad(callFieldSchemas.engineHoursReading.optional(), 'Engine hours'),
}).transform(v => ({ odometerReading: v.odometerReading ?? null, engineHoursReading: v.engineHoursReading ?? null }))
