import { z } from 'zod'

const cents = (label: string) => z.number({ message: `${label} must be an amount` }).int(`${label} must be whole cents`).min(0, `${label} cannot be negative`).max(100_000_000, `${label} is too large`)
const whole = (label: string, min: number, max: number) => z.number({ message: `${label} must be a number` }).int(`${label} must be a whole number`).min(min, `${label} cannot be below ${min}`).max(max, `${label} cannot be above ${max}`)

/** The admin's rates (POST /api/rates makes a new set in force from now). */
export const ratesSchema = z.object({
  laborCentsPerHour: cents('Labor rate'),
  afterHoursMultiplierPct: whole('After-hours multiplier', 100, 400),
  minimumLaborTenths: whole('Minimum labor', 0, 100),
  roadCallMinimumCents: cents('Road-call minimum'),
  travelCentsPerUnit: cents('Travel rate'),
  travelUnit: z.enum(['km', 'mi'], { message: 'Travel is billed per km or per mile' }),
  partsMarkupPct: whole('Parts markup', 0, 500),
  taxRateBasisPoints: whole('Tax rate', 0, 5000),
  laborTaxable: z.boolean({ message: 'Say whether labor is taxed' }),
  averageRoadKph: whole('Average road speed', 5, 150),
})
export type RatesInput = z.input<typeof ratesSchema>
