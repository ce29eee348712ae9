// What the invoice and the service report print for the truck's odometer and engine hours: the
// reading taken at the truck on this call when there is one, else the unit's last known figure.
type Known = { odometer: number | null, odometerUnit: string, engineHours: number | null }
type Taken = { odometerReading: number | null, engineHoursReading: number | null }

/** "412,300 mi", or null when neither the call nor the unit knows it. */
export function odometerShown(call: Taken | null | undefined, unit: Known | null | undefined): string | null {
  const v = call?.odometerReading ?? unit?.odometer ?? null
  return v == null ? null : `${v.toLocaleString('en-US')} ${unit?.odometerUnit ?? 'km'}`
}

/** "12,480.5 h", or null. */
export function engineHoursShown(call: Taken | null | undefined, unit: Pick<Known, 'engineHours'> | null | undefined): string | null {
  const v = call?.engineHoursReading ?? unit?.engineHours ?? null
  return v == null ? null : `${v.toLocaleString('en-US', { maximumFractionDigits: 1 })} h`
}
