// The words for a call's dash lamps and derate states, apart from the call schemas (shared/schemas/calls.ts
// re-exports them), so a screen that only shows a call loads no schema code.

/** Dash lamps a dispatcher asks the driver about; anything else is typed and kept as written. */
export const LAMPS = ['check_engine', 'stop_engine', 'emissions', 'def', 'abs', 'charging', 'oil_pressure', 'coolant'] as const
export const LAMP_LABELS: Record<(typeof LAMPS)[number], string> = {
  check_engine: 'Check engine',
  stop_engine: 'Stop engine',
  emissions: 'Emissions (exhaust filter)',
  def: 'DEF',
  abs: 'ABS',
  charging: 'Charging / battery',
  oil_pressure: 'Oil pressure',
  coolant: 'Coolant temperature',
}
export const DERATE_STATES = ['none', 'derated', 'countdown', 'shutdown'] as const
export const DERATE_LABELS: Record<(typeof DERATE_STATES)[number], string> = {
  none: 'Runs normally',
  derated: 'Derated (power or speed limited)',
  countdown: 'Countdown to derate or shutdown',
  shutdown: 'Shut down, will not run',
}
