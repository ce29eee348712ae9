// Lead-acid battery state of charge from its open-circuit (resting) voltage. The reading means
// something only at rest: the battery isolated (cables off or the disconnect open), no charge or
// load for some hours, and surface charge gone.

/** A battery maker's 80 °F open-circuit table for a 12 V flooded battery: [volts, percent charged]. */
export const BATTERY_OCV_TABLE_80F: readonly (readonly [number, number])[] = [
  [11.89, 0],
  [12.06, 25],
  [12.24, 50],
  [12.45, 75],
  [12.65, 100],
]

/**
 * Percent charged (0–100) of a resting lead-acid battery reading `volts`, linear between the
 * table's rows and clamped at its ends. A 24 V system is two 12 V batteries in series, so its
 * reading is halved; each battery should still be read on its own to find a weak one.
 */
export function batteryStateOfCharge(volts: number, systemVolts: 12 | 24 = 12): number {
  if (typeof volts !== 'number' || !Number.isFinite(volts)) throw new RangeError(`Battery voltage must be a finite number, got ${volts}`)
  if (volts < 0) throw new RangeError(`Battery voltage cannot be negative, got ${volts} V (meter leads swapped?)`)
  if (systemVolts !== 12 && systemVolts !== 24) throw new RangeError(`System voltage must be 12 or 24, got ${String(systemVolts)}`)
  const v = systemVolts === 24 ? volts / 2 : volts
  const rows = BATTERY_OCV_TABLE_80F
  if (v <= rows[0]![0]) return 0
  const top = rows[rows.length - 1]!
  if (v >= top[0]) return 100
  let i = 1
  while (rows[i]![0] < v) i++
  const [v0, p0] = rows[i - 1]!
  const [v1, p1] = rows[i]!
  return p0 + ((v - v0) / (v1 - v0)) * (p1 - p0)
}
