// A reading taken at the truck raises the unit's own odometer and engine hours, never lowers them:
// a lower reading is a typing slip or a swapped cluster, and the office corrects the unit by hand.
import { and, eq, isNull, lt, or } from 'drizzle-orm'
import type { Tx } from './db'

type Readings = { odometerReading?: unknown, engineHoursReading?: unknown }

export async function raiseUnitReadings(tx: Tx, unitId: string | null, r: Readings): Promise<void> {
  if (!unitId) return
  const { units } = tables
  if (typeof r.odometerReading === 'number') {
    await tx.update(units).set({ odometer: r.odometerReading })
      .where(and(eq(units.id, unitId), or(isNull(units.odometer), lt(units.odometer, r.odometerReading))))
  }
  if (typeof r.engineHoursReading === 'number') {
    await tx.update(units).set({ engineHours: r.engineHoursReading })
      .where(and(eq(units.id, unitId), or(isNull(units.engineHours), lt(units.engineHours, r.engineHoursReading))))
  }
}
