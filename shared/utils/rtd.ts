// Platinum RTD per IEC 60751 (Callendar–Van Dusen). Pt100, Pt200, Pt1000… differ only in R0,
// so every function takes r0 (the resistance at 0 °C) and scales the Pt100 curve.

// IEC 60751 coefficients. C only applies below 0 °C; above 0 °C the curve is a plain quadratic.
const CVD_A = 3.9083e-3
const CVD_B = -5.775e-7
const CVD_C = -4.183e-12

// The standard defines the curve only over this span; outside it we refuse rather than extrapolate.
const RTD_MIN_C = -200
const RTD_MAX_C = 850

function rtdCheckR0(r0: number): void {
  if (!Number.isFinite(r0) || r0 <= 0) {
    throw new RangeError(`RTD r0 (resistance at 0 °C) must be a positive finite number of ohms, got ${r0}`)
  }
}

// Pt100 ratio R/R0 at t (no range checks; callers check).
function cvdRatio(t: number): number {
  const base = 1 + CVD_A * t + CVD_B * t * t
  return t >= 0 ? base : base + CVD_C * (t - 100) * t * t * t
}

/** Resistance in ohms of a platinum RTD at tempC (IEC 60751, -200…850 °C). */
export function rtdResistance(tempC: number, r0 = 100): number {
  if (!Number.isFinite(tempC)) throw new RangeError(`RTD temperature must be a finite number, got ${tempC}`)
  if (tempC < RTD_MIN_C || tempC > RTD_MAX_C) {
    throw new RangeError(`RTD temperature ${tempC} °C is outside the IEC 60751 range ${RTD_MIN_C}…${RTD_MAX_C} °C`)
  }
  rtdCheckR0(r0)
  return r0 * cvdRatio(tempC)
}

/** Temperature in °C of a platinum RTD reading `ohms` (inverse of rtdResistance, to well under 0.01 °C). */
export function rtdTemperature(ohms: number, r0 = 100): number {
  if (typeof ohms !== 'number' || Number.isNaN(ohms)) throw new RangeError(`RTD resistance must be a number, got ${ohms}`)
  if (ohms < 0) throw new RangeError(`RTD resistance cannot be negative, got ${ohms} Ω`)
  if (!Number.isFinite(ohms)) throw new RangeError('RTD resistance is infinite (open circuit / OL): no temperature')
  rtdCheckR0(r0)
  const ratio = ohms / r0
  // Published tables print ohms to 0.01 Ω per 100 Ω of R0, and the −200 °C row (18.52 Ω) rounds below the
  // curve's own end: a reading that close to an end is taken as the end, not refused.
  const slack = 5e-5
  if (ratio < cvdRatio(RTD_MIN_C) - slack) {
    throw new RangeError(`${ohms} Ω is below the IEC 60751 range for R0 = ${r0} Ω (colder than ${RTD_MIN_C} °C)`)
  }
  if (ratio > cvdRatio(RTD_MAX_C) + slack) {
    throw new RangeError(`${ohms} Ω is above the IEC 60751 range for R0 = ${r0} Ω (hotter than ${RTD_MAX_C} °C)`)
  }
  if (ratio <= cvdRatio(RTD_MIN_C)) return RTD_MIN_C
  if (ratio >= cvdRatio(RTD_MAX_C)) return RTD_MAX_C
  if (ratio >= 1) {
    // Closed form of B t² + A t + (1 − ratio) = 0, written as 2(ratio−1)/(A+√…) rather than
    // (−A+√…)/2B: the textbook form subtracts two nearly equal numbers close to 0 °C.
    const root = Math.sqrt(CVD_A * CVD_A - 4 * CVD_B * (1 - ratio))
    return (2 * (ratio - 1)) / (CVD_A + root)
  }
  // Below 0 °C the C term makes it a quartic: Newton from the quadratic's answer converges in a few steps.
  const q = Math.sqrt(CVD_A * CVD_A - 4 * CVD_B * (1 - ratio))
  let t = (2 * (ratio - 1)) / (CVD_A + q)
  for (let i = 0; i < 50; i++) {
    const f = cvdRatio(t) - ratio
    const df = CVD_A + 2 * CVD_B * t + CVD_C * (4 * t * t * t - 300 * t * t)
    const step = f / df
    t -= step
    if (Math.abs(step) < 1e-10) break
  }
  return t
}

/**
 * The resistance window of a platinum RTD at the part's temperature: the curve's ohms at
 * tempC − toleranceC and tempC + toleranceC (IEC 60751). Give the tolerance in °C (a class
 * tolerance, or the thermometer's own error added to it); the curve turns it into ohms.
 */
export function rtdWindow(tempC: number, toleranceC: number, r0 = 100): { min: number, max: number } {
  if (typeof tempC !== 'number' || !Number.isFinite(tempC)) throw new RangeError(`RTD temperature must be a finite number, got ${tempC}`)
  if (typeof toleranceC !== 'number' || !Number.isFinite(toleranceC) || toleranceC < 0) {
    throw new RangeError(`RTD tolerance must be a finite number of °C, zero or more, got ${toleranceC}`)
  }
  rtdCheckR0(r0)
  const lo = tempC - toleranceC
  const hi = tempC + toleranceC
  if (lo < RTD_MIN_C || hi > RTD_MAX_C) {
    throw new RangeError(`RTD window ${lo}…${hi} °C reaches outside the IEC 60751 range ${RTD_MIN_C}…${RTD_MAX_C} °C`)
  }
  return { min: rtdResistance(lo, r0), max: rtdResistance(hi, r0) }
}
