// What the mechanic records on a call, as the phone's forms check it before queuing. Shapes follow
// DESIGN.md ("The smallest create shapes"); records carry more fields than those.
import { z } from 'zod'
import { parseDtc } from '../utils/dtc'
import { specBounds } from '../utils/spec'
import { READING_QUANTITIES } from './sync'
import { cleanText, requiredText } from './text'

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
const keypadNumber = (v: unknown) => (typeof v === 'string' ? (v.trim() === '' ? undefined : Number(v.trim().replace(',', '.'))) : v)
const num = (label: string) => z.number({ message: `${label} must be a number` })
export const typedNumber = (label: string, check: (n: z.ZodNumber) => z.ZodNumber = n => n) => z.preprocess(keypadNumber, check(num(label)))
const optTypedNumber = (label: string, check: (n: z.ZodNumber) => z.ZodNumber = n => n) => z.preprocess(keypadNumber, check(num(label)).optional())
const optText = (max: number, label: string, multiline = false) => cleanText(label, { multiline })
  .max(max, `${label} is too long (at most ${max} characters)`)
  .optional().transform(v => (v ? v : undefined))

export const readingSpecSchema = z.object({
  min: optTypedNumber('Spec low limit'),
  max: optTypedNumber('Spec high limit'),
  nominal: optTypedNumber('Spec nominal'),
  tolerance: optTypedNumber('Spec tolerance'),
  tolerancePct: optTypedNumber('Spec tolerance %'),
}).transform(s => Object.fromEntries(Object.entries(s).filter(([, v]) => v !== undefined)) as Record<string, number>)
  .superRefine((s, ctx) => {
    if (!Object.keys(s).length) return
    try { specBounds(s) }
    catch (err) { ctx.addIssue({ code: 'custom', message: err instanceof Error ? err.message : 'Spec is not valid' }) }
  })

export const readingInputSchema = z.object({
  label: requiredText(120, 'Label', { missing: 'Say what was measured' }),
  quantity: z.enum(READING_QUANTITIES, { message: 'Pick what kind of value it is' }),
  value: typedNumber('Value'),
  unit: requiredText(16, 'Unit', { missing: 'Pick the unit' }),
  component: optText(120, 'Where taken'),
  pins: optText(60, 'Pins'),
  conditions: optText(120, 'Conditions'),
  spec: readingSpecSchema.optional(),
})
export type ReadingInput = z.input<typeof readingInputSchema>

export const faultCodeInputSchema = z.object({
  form: z.enum(['j2012', 'j1939']),
  code: cleanText('Code').max(40, 'Code is too long').optional(),
  spn: optTypedNumber('SPN'),
  fmi: optTypedNumber('FMI'),
  state: z.enum(['active', 'stored'], { message: 'Pick active or stored' }),
  count: typedNumber('Count', n => n.int('Count must be a whole number').min(0, 'Count cannot be below 0').max(127, 'Count cannot be above 127')),
}).superRefine((v, ctx) => {
  if (v.form === 'j2012') {
    try { parseDtc(v.code ?? '') }
    catch (err) { ctx.addIssue({ code: 'custom', path: ['code'], message: err instanceof Error ? err.message : 'Not a fault code' }) }
    return
  }
  if (v.spn === undefined || !Number.isInteger(v.spn) || v.spn < 0 || v.spn > 524287) ctx.addIssue({ code: 'custom', path: ['spn'], message: 'SPN must be a whole number 0–524287' })
  if (v.fmi === undefined || !Number.isInteger(v.fmi) || v.fmi < 0 || v.fmi > 31) ctx.addIssue({ code: 'custom', path: ['fmi'], message: 'FMI must be a whole number 0–31' })
}).transform(v => (v.form === 'j2012'
  ? { code: parseDtc(v.code ?? '').code, state: v.state, count: v.count }
  : { spn: v.spn as number, fmi: v.fmi as number, state: v.state, count: v.count }))

export const noteInputSchema = z.object({
  text: requiredText(4000, 'Note', { multiline: true, missing: 'Write the note first' }),
})

const cents = (label: string) => optTypedNumber(label, n => n.min(0, `${label} cannot be negative`).max(10_000_000, `${label} is too large`))
  .transform(v => (v === undefined ? undefined : Math.round(v * 100)))

export const partLineInputSchema = z.object({
  partNumber: requiredText(40, 'Part number', { missing: 'Part number is required' }),
  description: requiredText(200, 'Description', { missing: 'Description is required' }),
  quantity: typedNumber('Quantity', n => n.gt(0, 'Quantity must be above 0').max(1000, 'Quantity is too large')),
  unitPrice: cents('Unit price'),
  corePrice: cents('Core charge'),
  serviceTruckId: z.string().uuid().optional(),
}).transform(({ unitPrice, corePrice, ...p }) => ({ ...p, unitPriceCents: unitPrice ?? 0, coreChargeCents: corePrice ?? 0 }))

export const storyInputSchema = z.object({
  storyComplaint: cleanText('Complaint', { multiline: true }).max(4000, 'Complaint is too long'),
  storyCause: cleanText('Cause', { multiline: true }).max(4000, 'Cause is too long'),
  storyCorrection: cleanText('Correction', { multiline: true }).max(4000, 'Correction is too long'),
})

export const signOffInputSchema = z.object({
  driverName: requiredText(120, 'Name', { missing: 'Write the driver\'s name' }),
  signature: z.string({ message: 'The driver signs in the box first' })
    .startsWith('data:image/png;base64,', 'The driver signs in the box first')
    .max(400_000, 'The signature is too large; clear it and sign again'),
})

export const verificationInputSchema = z.object({
  codesCleared: z.boolean(),
  liveValuesChecked: z.boolean(),
  liveValuesNote: optText(500, 'Live values note', true),
  testDriveKm: optTypedNumber('Test drive distance', n => n.min(0, 'Distance cannot be negative').max(2000, 'Distance is too large')),
  testDriveMinutes: optTypedNumber('Test drive time', n => n.min(0, 'Time cannot be negative').max(1440, 'Time is too long')),
  lampsOff: z.boolean(),
  derateGone: z.boolean(),
})
export type VerificationInput = z.input<typeof verificationInputSchema>

export const followUpInputSchema = z.object({
  followUp: requiredText(1000, 'Follow-up', { multiline: true, missing: 'Say what still needs doing' }),
})
