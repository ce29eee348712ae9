import { z } from 'zod'
import { centsSchema } from './money'
import { isTimeZone } from '../utils/businessHours'
import { isoDay } from './dates'
import { cleanText } from './text'

const cents = (label: string) => centsSchema(label)
const whole = (label: string, min: number, max: number, above = `${label} cannot be above ${max}`) => z
  .number({ message: `${label} must be a number` }).int(`${label} must be a whole number`)
  .min(min, `${label} cannot be below ${min}`).max(max, above)
const yes = (label: string) => z.boolean({ message: `Say whether ${label} are taxed` })
const text = (label: string, max: number) => cleanText(label).max(max, `${label} is too long`)

/** Highest tax rate accepted, in basis points (30 %): a higher figure is a typing slip. */
export const MAX_TAX_BASIS_POINTS = 3000

/** The admin's rates (POST /api/rates makes a new set in force from now). */
export const ratesSchema = z.object({
  laborCentsPerHour: cents('Labor rate'),
  afterHoursMultiplierPct: whole('After-hours multiplier', 100, 400),
  minimumLaborTenths: whole('Minimum labor', 0, 100),
  roadCallMinimumCents: cents('Road-call minimum'),
  travelBasis: z.enum(['distance', 'time'], { message: 'Travel is billed by distance or by clocked time' }).default('distance'),
  travelCentsPerUnit: cents('Travel rate'),
  travelUnit: z.enum(['km', 'mi'], { message: 'Travel is billed per km or per mile' }),
  travelCentsPerHour: cents('Travel time rate').default(0),
  roadFactorPct: whole('Road factor', 100, 300, 'Road factor cannot be above 3.00').default(100),
  partsMarkupPct: whole('Parts markup', 0, 500),
  taxRateBasisPoints: whole('Tax rate', 0, MAX_TAX_BASIS_POINTS, 'Tax rate cannot be above 30 %'),
  laborTaxable: yes('labor and the road-call minimum'),
  travelTaxable: yes('travel charges').default(false),
  partsTaxable: yes('parts').default(true),
  coresTaxable: yes('core charges').default(false),
  feesTaxable: yes('shop supplies and fees').default(false),
  shopSuppliesBasisPoints: whole('Shop supplies', 0, 2500, 'Shop supplies cannot be above 25 % of labor').default(0),
  shopSuppliesCapCents: cents('Shop supplies cap').nullable().default(null),
  environmentalFeeCents: cents('Environmental fee').default(0),
  averageRoadKph: whole('Average road speed', 5, 150),
  timeZone: z.string({ message: 'Choose the time zone' })
    .refine(isTimeZone, 'Not a time zone this system knows (use a name like America/Chicago)').default('UTC'),
  openMinute: whole('Opening time', 0, 1440).default(0),
  closeMinute: whole('Closing time', 0, 1440).default(1440),
  openDays: z.array(whole('Open day', 1, 7), { message: 'List the open days' }).max(7).default([1, 2, 3, 4, 5, 6, 7]),
  holidays: z.array(isoDay('A holiday'), { message: 'List the holidays' })
    .max(60, 'At most 60 holidays').default([]),
  businessName: text('Business name', 120).default(''),
  businessPhone: text('Business phone', 40).default(''),
  businessEmail: text('Business e-mail', 200).default(''),
  remitAddress: text('Remit-to address', 300).default(''),
  statusLinkDays: whole('Status link lifetime', 1, 90, 'A status link lasts at most 90 days').default(14),
  /** Minutes an assignment may go unacted on (not en route) before the board turns it red. */
  assignmentAlarmMinutes: whole('Assignment alarm', 1, 240, 'The assignment alarm is at most 240 minutes (4 hours)').default(10),
}).refine(r => r.closeMinute > r.openMinute || (r.openMinute === 0 && r.closeMinute === 0),
  { message: 'Closing time must be after opening time', path: ['closeMinute'] })
export type RatesInput = z.input<typeof ratesSchema>
export type Rates = z.output<typeof ratesSchema>
