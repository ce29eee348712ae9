import type { NumericMeasure } from '#shared/schemas/testCards'
import type { MeasureUnit } from '#shared/utils/units'

/** The mechanic's preferred unit for a quantity, read from and written to the prefs store. */
export function useReadingUnit(quantity: MaybeRefOrGetter<NumericMeasure>) {
  const prefs = usePrefsStore()
  return computed<MeasureUnit>({
    get() {
      switch (toValue(quantity)) {
        case 'temperature': return prefs.temperatureUnit
        case 'resistance': return prefs.resistanceUnit
        case 'voltage': return prefs.voltageUnit
        case 'pressure': return prefs.pressureUnit
        default: return 'pct'
      }
    },
    set(u) {
      switch (toValue(quantity)) {
        case 'temperature':
          prefs.temperatureUnit = u as 'degC' | 'degF'
          break
        case 'resistance':
          prefs.resistanceUnit = u as 'ohm' | 'kohm'
          break
        case 'voltage':
          prefs.voltageUnit = u as 'V' | 'mV'
          break
        case 'pressure':
          prefs.pressureUnit = u as 'kPa' | 'psi'
          break
      }
    },
  })
}

/** A number as typed on a phone keypad: '118', '4.95', '4,95' (decimal comma), '-12'. */
export function parseTypedNumber(text: string): number | undefined {
  const t = text.trim().replace(',', '.')
  if (!/^-?(\d+(\.\d*)?|\.\d+)$/.test(t)) return undefined
  return Number(t)
}
