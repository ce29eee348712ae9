import { describe, expect, it } from 'vitest'
import { truckReadingsInputSchema } from '../../shared/schemas/fieldwork'
import { callUpdateSchema } from '../../shared/schemas/syncRecords'
import { engineHoursShown, odometerShown } from '../../shared/utils/truckReadingText'

// The readings taken at the truck: the phone's form and the sync op share the bounds of the unit's own
// odometer (a whole number up to 9,999,999) and engine hours (up to 999,999); Wayside's own limits.
describe('truck readings typed on the phone', () => {
  it('reads the keypad: a decimal comma, an empty box as no reading', () => {
    expect(truckReadingsInputSchema.parse({ odometerReading: '412300', engineHoursReading: '12480,5' }))
      .toEqual({ odometerReading: 412300, engineHoursReading: 12480.5 })
    expect(truckReadingsInputSchema.parse({ odometerReading: '', engineHoursReading: ' ' }))
      .toEqual({ odometerReading: null, engineHoursReading: null })
  })

  it('names the field of a bad value', () => {
    const bad = truckReadingsInputSchema.safeParse({ odometerReading: '412300.5', engineHoursReading: 'lots' })
    expect(bad.success).toBe(false)
    const paths = bad.error!.issues.map(i => [i.path.join('.'), i.message])
    expect(paths).toContainEqual(['odometerReading', 'Odometer must be a whole number'])
    expect(paths).toContainEqual(['engineHoursReading', 'Engine hours must be a number'])
    const op = callUpdateSchema.safeParse({ odometerReading: -1, engineHoursReading: 1_000_000 })
    expect(op.error!.issues.map(i => i.path.join('.')).sort()).toEqual(['engineHoursReading', 'odometerReading'])
  })
})

describe('what the invoice and service report print', () => {
  const unit = { odometer: 400_000, odometerUnit: 'mi', engineHours: 12_000 }
  it('the call\'s reading when there is one, else the unit\'s', () => {
    expect(odometerShown({ odometerReading: 412_300, engineHoursReading: null }, unit)).toBe('412,300 mi')
    expect(odometerShown({ odometerReading: null, engineHoursReading: null }, unit)).toBe('400,000 mi')
    expect(engineHoursShown({ odometerReading: null, engineHoursReading: 12_480.5 }, unit)).toBe('12,480.5 h')
    expect(engineHoursShown(null, unit)).toBe('12,000 h')
    expect(odometerShown(null, null)).toBeNull()
  })
})
