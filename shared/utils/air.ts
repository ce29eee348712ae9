// Air brakes: the leak-down arithmetic and the numbers of the daily air-brake check, as the model
// commercial driver's manual gives them (section 5.3, "Inspecting air brake systems"; state CDL
// manuals reprint it). The maker's figures for the vehicle come first where they differ.

/** Where the numbers below come from, for cards that cite them. */
export const AIR_BRAKE_CHECK_SOURCE = 'Model commercial driver\u2019s manual, section 5.3 (air brake check)'

/** Greatest air loss (psi per minute) after the system settles: brakes released, or applied after the first drop. */
export const AIR_LEAK_MAX_PSI_PER_MIN = {
  released: { single: 2, combination: 3 },
  applied: { single: 3, combination: 4 },
} as const

/** Build-up at operating rpm in a dual air system: 85 to 100 psi within 45 s (larger tanks may take longer; maker's spec). */
export const AIR_BUILDUP_FROM_PSI = 85
export const AIR_BUILDUP_TO_PSI = 100
export const AIR_BUILDUP_MAX_SECONDS = 45

/** The governor stops the compressor at about 125 psi and starts it again at about 100 psi (maker's spec governs). */
export const AIR_GOVERNOR_CUT_OUT_PSI = 125
export const AIR_GOVERNOR_CUT_IN_PSI = 100

/** The low-air warning must come on before the pressure falls below 60 psi. */
export const AIR_LOW_WARNING_MIN_PSI = 60

/** Spring brakes apply (the parking knob pops out) at the maker's pressure, usually between 20 and 45 psi. */
export const AIR_SPRING_BRAKE_MIN_PSI = 20
export const AIR_SPRING_BRAKE_MAX_PSI = 45

function airCheckPsi(name: string, v: number): void {
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`${name} must be a finite number of psi, got ${v}`)
  if (v < 0) throw new RangeError(`${name} cannot be below 0 psi on the gauge, got ${v}`)
}

/** Pressure lost per minute between two gauge readings taken `seconds` apart. */
export function airLeakRate(startPsi: number, endPsi: number, seconds: number): number {
  airCheckPsi('Starting pressure', startPsi)
  airCheckPsi('Ending pressure', endPsi)
  if (typeof seconds !== 'number' || !Number.isFinite(seconds) || seconds <= 0) {
    throw new RangeError(`Time between the readings must be a positive number of seconds, got ${seconds}`)
  }
  if (endPsi > startPsi) {
    throw new RangeError(`Ending pressure ${endPsi} psi is above the starting ${startPsi} psi: was the engine still charging the tanks?`)
  }
  return ((startPsi - endPsi) / seconds) * 60
}

/** Whether a leak-down rate passes the check for the vehicle and brake state. A rate exactly at the limit passes. */
export function airLeakVerdict(input: { psiPerMin: number, brakes: 'released' | 'applied', combination: boolean }): 'pass' | 'fail' {
  if (!input || typeof input !== 'object') throw new RangeError('Leak check needs psiPerMin, brakes and combination')
  const { psiPerMin, brakes, combination } = input
  if (typeof psiPerMin !== 'number' || !Number.isFinite(psiPerMin) || psiPerMin < 0) {
    throw new RangeError(`Leak rate must be a finite number of psi per minute, zero or more, got ${psiPerMin}`)
  }
  if (brakes !== 'released' && brakes !== 'applied') throw new RangeError(`brakes must be 'released' or 'applied', got ${String(brakes)}`)
  if (typeof combination !== 'boolean') throw new RangeError(`combination must be true or false, got ${String(combination)}`)
  const limit = AIR_LEAK_MAX_PSI_PER_MIN[brakes][combination ? 'combination' : 'single']
  // A reading of exactly the limit, after float arithmetic, still passes.
  return psiPerMin <= limit + 1e-9 ? 'pass' : 'fail'
}
