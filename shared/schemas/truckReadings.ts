import { z } from 'zod'

// The odometer and engine hours read at the truck on arrival, kept on the call (the mechanic's
// fields) and raised onto the unit. The bounds are the unit form's own (shared/schemas/units.ts),
// so a reading the phone takes is one the unit can hold.
export const ODOMETER_MAX = 9_999_999
export const ENGINE_HOURS_MAX = 999_999

export const truckReadingFields = {
  odometerReading: z.number({ message: 'Odometer must be a number' }).int('Odometer must be a whole number')
    .min(0, 'Odometer cannot be below 0').max(ODOMETER_MAX, `Odometer cannot be above ${ODOMETER_MAX}`).nullable(),
  engineHoursReading: z.number({ message: 'Engine hours must be a number' })
    .min(0, 'Engine hours cannot be below 0').max(ENGINE_HOURS_MAX, `Engine hours cannot be above ${ENGINE_HOURS_MAX}`).nullable(),
}

export const truckReadingsSchema = z.object(truckReadingFields)
export type TruckReadings = z.output<typeof truckReadingsSchema>
