// Guided check of a sensor circuit the way a mechanic works it: reference first, then ground,
// then the sensor itself. The verdict is the first fault found in that order, because a bad
// reference or ground makes every later measurement meaningless.

import { judge, describeSpec, type JudgeSpec } from './spec'

export type CircuitVerdict
  = | 'ok'
    | 'no_reference'
    | 'low_reference'
    | 'high_reference'
    | 'bad_ground'
    | 'sensor_open'
    | 'sensor_shorted'
    | 'sensor_out_of_spec'

export interface SensorCircuitReadings {
  /** Reference voltage at the harness connector, key on engine off. */
  refVolts?: number
  /**
   * Whether the reference was read loaded (back-probed with the sensor connected) rather than at
   * an unplugged connector. With no current flowing a resistive wire still reads full voltage, so
   * only a loaded reading can show resistance in the wire.
   */
  refLoaded?: boolean
  /** What the module should supply; default 5 V. */
  expectedRefVolts?: number
  /** Sensor-ground pin to battery negative / chassis, ohms. */
  groundOhms?: number
  /** Voltage drop across the sensor ground path under load. */
  groundDropVolts?: number
  /** Sensor resistance, disconnected; Infinity for a meter showing OL. */
  sensorOhms?: number
  /** Spec the sensor resistance must meet (e.g. from a sensor model at ambient). */
  expectedSensor?: JudgeSpec
  /** Signal voltage at the connector, sensor connected, key on. */
  signalVolts?: number
}

export const CIRCUIT_LIMITS = {
  // Service procedures accept about 4.8–5.2 V on a 5 V reference (REFERENCES §7): ±4 %.
  refTolerancePct: 4,
  // Below a tenth of the expected reference, treat it as absent (common practice).
  noRefFraction: 0.1,
  // Sensor ground should read a few ohms at most; over 5 Ω or 0.1 V drop is high (common practice).
  groundMaxOhms: 5,
  groundMaxDropVolts: 0.1,
  // OL or over 1 MΩ is open; under 1 Ω is a dead short for any sensor element (common practice).
  openOhms: 1e6,
  shortOhms: 1,
  // A pulled-up signal within 0.1 V of the reference, or under 0.1 V, is at a rail (common practice).
  signalRailVolts: 0.1,
} as const

function circuitNum(name: string, v: number | undefined, opts: { ohms?: boolean } = {}): v is number {
  if (v === undefined || v === null) return false
  if (typeof v !== 'number' || Number.isNaN(v)) throw new RangeError(`${name} must be a number, got ${v}`)
  if (opts.ohms) {
    if (v < 0) throw new RangeError(`${name} cannot be negative, got ${v} Ω`)
    return true // Infinity allowed: the meter's OL
  }
  if (!Number.isFinite(v)) throw new RangeError(`${name} must be finite, got ${v}`)
  return true
}

const fmtV = (v: number) => `${Number(v.toFixed(3))} V`
function fmtOhm(v: number): string {
  if (v === Infinity) return 'OL (open)'
  if (v >= 1e6) return `${Number((v / 1e6).toFixed(3))} MΩ`
  if (v >= 1000) return `${Number((v / 1000).toFixed(3))} kΩ`
  return `${Number(v.toFixed(3))} Ω`
}

/** Classify a sensor circuit from whatever was measured; findings say what each number means. */
export function classifySensorCircuit(readings: SensorCircuitReadings): { verdict: CircuitVerdict, findings: string[] } {
  if (!readings || typeof readings !== 'object') throw new RangeError('Readings must be an object')
  const r = readings
  const findings: string[] = []
  const faults: CircuitVerdict[] = []
  const L = CIRCUIT_LIMITS

  const expected = circuitNum('Expected reference voltage', r.expectedRefVolts) ? r.expectedRefVolts : 5
  if (expected <= 0) throw new RangeError(`Expected reference voltage must be positive, got ${expected}`)
  const hasRef = circuitNum('Reference voltage', r.refVolts)
  const hasGndOhms = circuitNum('Ground resistance', r.groundOhms, { ohms: true })
  const hasGndDrop = circuitNum('Ground voltage drop', r.groundDropVolts)
  const hasSensor = circuitNum('Sensor resistance', r.sensorOhms, { ohms: true })
  const hasSignal = circuitNum('Signal voltage', r.signalVolts)
  if (!hasRef && !hasGndOhms && !hasGndDrop && !hasSensor && !hasSignal) {
    throw new RangeError('No measurement given: nothing to classify')
  }

  if (hasRef) {
    const ref = r.refVolts as number
    const lo = expected * (1 - L.refTolerancePct / 100)
    const hi = expected * (1 + L.refTolerancePct / 100)
    const absent = expected * L.noRefFraction
    if (ref < -absent) throw new RangeError(`Reference reads ${fmtV(ref)}: meter leads reversed? Measure again`)
    if (ref < absent) {
      faults.push('no_reference')
      findings.push(`Reference reads ${fmtV(ref)}, under ${fmtV(absent)}: no reference from the module (open wire or module not powered)`)
    }
    else if (ref < lo) {
      faults.push('low_reference')
      findings.push(r.refLoaded
        ? `Reference reads ${fmtV(ref)} under load, below the ${fmtV(lo)} minimum: `
        + 'resistance in the wire or a connector, or a sensor on a shared reference drawing too much'
        : `Reference reads ${fmtV(ref)} with nothing connected, below the ${fmtV(lo)} minimum: pulled down by a leak to ground `
          + '(a shorted sensor on a shared reference, a chafed or wet wire) or a weak supply in the controller. '
          + 'Resistance in the wire cannot show without a load: back-probe with the sensor connected to look for it')
    }
    else if (ref > hi) {
      faults.push('high_reference')
      findings.push(`Reference reads ${fmtV(ref)}, above the ${fmtV(hi)} maximum: possible short to a higher voltage`)
    }
    else {
      findings.push(`Reference reads ${fmtV(ref)}, within ${fmtV(lo)}–${fmtV(hi)}: good`)
    }
  }

  if (hasGndOhms) {
    const g = r.groundOhms as number
    if (g > L.groundMaxOhms) {
      faults.push('bad_ground')
      findings.push(`Ground path reads ${fmtOhm(g)}, over the ${L.groundMaxOhms} Ω limit: poor sensor ground`)
    }
    else findings.push(`Ground path reads ${fmtOhm(g)}, within the ${L.groundMaxOhms} Ω limit: good`)
  }
  if (hasGndDrop) {
    // Sign only tells lead orientation; the size of the drop is what matters.
    const d = Math.abs(r.groundDropVolts as number)
    if (d > L.groundMaxDropVolts) {
      faults.push('bad_ground')
      findings.push(`Ground drop is ${fmtV(d)}, over the ${fmtV(L.groundMaxDropVolts)} limit: poor sensor ground`)
    }
    else findings.push(`Ground drop is ${fmtV(d)}, within the ${fmtV(L.groundMaxDropVolts)} limit: good`)
  }

  if (hasSensor) {
    const s = r.sensorOhms as number
    if (s > L.openOhms) {
      faults.push('sensor_open')
      findings.push(`Sensor reads ${fmtOhm(s)}, over ${fmtOhm(L.openOhms)}: sensor element open`)
    }
    else if (s < L.shortOhms) {
      faults.push('sensor_shorted')
      findings.push(`Sensor reads ${fmtOhm(s)}, under ${fmtOhm(L.shortOhms)}: sensor element shorted`)
    }
    else if (r.expectedSensor) {
      const verdict = judge(s, r.expectedSensor)
      const text = describeSpec(r.expectedSensor, 'ohm')
      if (verdict === 'pass') findings.push(`Sensor reads ${fmtOhm(s)}, within spec ${text}: good`)
      else {
        faults.push('sensor_out_of_spec')
        findings.push(`Sensor reads ${fmtOhm(s)}, ${verdict === 'low' ? 'below' : 'above'} spec ${text}`)
      }
    }
    else findings.push(`Sensor reads ${fmtOhm(s)}: not open, not shorted (no spec given to judge it further)`)
  }

  if (hasSignal) {
    // Only decisive on a two-wire pulled-up sensor (thermistor); so it never overrides a resistance reading.
    const sig = r.signalVolts as number
    const ref = hasRef ? (r.refVolts as number) : expected
    const refFault = faults.some(f => f === 'no_reference' || f === 'low_reference' || f === 'high_reference')
    if (refFault) {
      findings.push(`Signal reads ${fmtV(sig)}: not interpreted until the reference is fixed`)
    }
    else if (sig >= ref - L.signalRailVolts) {
      findings.push(`Signal reads ${fmtV(sig)}, at the ${fmtV(ref)} reference: `
        + 'on a two-wire sensor this means the sensor or its wiring is open')
      if (!hasSensor) faults.push('sensor_open')
    }
    else if (sig <= L.signalRailVolts) {
      findings.push(`Signal reads ${fmtV(sig)}, under ${fmtV(L.signalRailVolts)}: `
        + 'on a two-wire sensor this means the sensor or signal wire is shorted to ground')
      if (!hasSensor) faults.push('sensor_shorted')
    }
    else findings.push(`Signal reads ${fmtV(sig)}, between the rails: circuit is live`)
  }

  return { verdict: faults[0] ?? 'ok', findings }
}
