import { describe, expect, it } from 'vitest'
import { CIRCUIT_LIMITS, classifySensorCircuit } from '../../shared/utils/circuit'
import { ntcResistanceBeta } from '../../shared/utils/ntc'

// A 10 kΩ / 3950 K coolant-temperature thermistor at 20 °C ambient, ±5 %: the Beta equation (REFERENCES §2)
const ectSpec = { nominal: ntcResistanceBeta(20, 10000, 3950), tolerancePct: 5 }

describe('classifySensorCircuit', () => {
  it('all good', () => {
    // REFERENCES §7: reference 4.8–5.2 V; common practice: ground ≤ 5 Ω; Beta equation spec
    const r = classifySensorCircuit({ refVolts: 5.01, groundOhms: 0.4, sensorOhms: 12400, expectedSensor: ectSpec })
    expect(r.verdict).toBe('ok')
    expect(r.findings).toHaveLength(3)
    expect(r.findings.every(f => /good/.test(f))).toBe(true)
  })

  it('reference limits 4.8–5.2 V inclusive', () => {
    // REFERENCES §7: service procedures accept about 4.8–5.2 V
    expect(CIRCUIT_LIMITS.refTolerancePct).toBe(4)
    expect(classifySensorCircuit({ refVolts: 4.8 }).verdict).toBe('ok')
    expect(classifySensorCircuit({ refVolts: 5.2 }).verdict).toBe('ok')
    const low = classifySensorCircuit({ refVolts: 4.6 })
    expect(low.verdict).toBe('low_reference')
    expect(low.findings[0]).toMatch(/4\.6 V.*4\.8 V/)
    // Ohm's law: with no current a wire's resistance drops no voltage, so an unloaded low reading is never "resistance in the wire"
    expect(low.findings[0]).toMatch(/with nothing connected.*leak to ground/)
    expect(low.findings[0]).toMatch(/Resistance in the wire cannot show without a load/)
    const loaded = classifySensorCircuit({ refVolts: 4.6, refLoaded: true })
    expect(loaded.verdict).toBe('low_reference')
    expect(loaded.findings[0]).toMatch(/under load.*resistance in the wire or a connector/)
    const high = classifySensorCircuit({ refVolts: 5.4 })
    expect(high.verdict).toBe('high_reference')
    expect(high.findings[0]).toMatch(/5\.4 V.*5\.2 V/)
  })

  it('no reference', () => {
    // common practice: a reference under a tenth of nominal is absent (open wire or module unpowered)
    const r = classifySensorCircuit({ refVolts: 0.02, sensorOhms: 12400 })
    expect(r.verdict).toBe('no_reference')
    expect(r.findings[0]).toMatch(/0\.02 V/)
    // slight negative noise on a dead reference is still "none"
    expect(classifySensorCircuit({ refVolts: -0.01 }).verdict).toBe('no_reference')
  })

  it('scales the reference window for a non-5 V supply', () => {
    // REFERENCES §7 window (±4 %) applied to an 8 V supply: 7.68–8.32 V
    expect(classifySensorCircuit({ refVolts: 8.1, expectedRefVolts: 8 }).verdict).toBe('ok')
    expect(classifySensorCircuit({ refVolts: 7.5, expectedRefVolts: 8 }).verdict).toBe('low_reference')
  })

  it('bad ground by resistance or by drop', () => {
    // common practice: sensor ground over 5 Ω is high
    const byOhms = classifySensorCircuit({ refVolts: 5.0, groundOhms: 12 })
    expect(byOhms.verdict).toBe('bad_ground')
    expect(byOhms.findings[1]).toMatch(/12 Ω.*5 Ω/)
    expect(classifySensorCircuit({ groundOhms: 5 }).verdict).toBe('ok')
    // REFERENCES §7 (SAE voltage-drop recommendation): 0.1 V per connection; over it is high
    const byDrop = classifySensorCircuit({ groundDropVolts: 0.25 })
    expect(byDrop.verdict).toBe('bad_ground')
    expect(byDrop.findings[0]).toMatch(/0\.25 V.*0\.1 V/)
    expect(classifySensorCircuit({ groundDropVolts: 0.05 }).verdict).toBe('ok')
  })

  it('sensor open (OL or over 1 MΩ) and shorted (under 1 Ω)', () => {
    // common practice: OL / over 1 MΩ is open, under 1 Ω is shorted
    const ol = classifySensorCircuit({ refVolts: 5.0, groundOhms: 0.3, sensorOhms: Infinity })
    expect(ol.verdict).toBe('sensor_open')
    expect(ol.findings[2]).toMatch(/OL/)
    expect(classifySensorCircuit({ sensorOhms: 2.5e6 }).verdict).toBe('sensor_open')
    expect(classifySensorCircuit({ sensorOhms: 1e6 }).verdict).toBe('ok')
    const sh = classifySensorCircuit({ sensorOhms: 0.2 })
    expect(sh.verdict).toBe('sensor_shorted')
    expect(sh.findings[0]).toMatch(/0\.2 Ω.*1 Ω/)
  })

  it('sensor out of spec', () => {
    // Beta equation (REFERENCES §2), 10 kΩ / 3950 K at 20 °C = 12 535 Ω; 8 kΩ is far below that ±5 % window
    const r = classifySensorCircuit({ sensorOhms: 8000, expectedSensor: ectSpec })
    expect(r.verdict).toBe('sensor_out_of_spec')
    expect(r.findings[0]).toMatch(/8 kΩ.*below spec/)
  })

  it('diagnoses in order: reference, then ground, then sensor', () => {
    // common practice: a bad reference or ground makes sensor readings meaningless
    const r = classifySensorCircuit({ refVolts: 4.2, groundOhms: 40, sensorOhms: Infinity })
    expect(r.verdict).toBe('low_reference')
    expect(r.findings).toHaveLength(3)
    expect(classifySensorCircuit({ refVolts: 5, groundOhms: 40, sensorOhms: Infinity }).verdict).toBe('bad_ground')
  })

  it('signal voltage at a rail on a two-wire sensor', () => {
    // common practice: a pulled-up thermistor signal at reference means open, near 0 V means shorted
    expect(classifySensorCircuit({ refVolts: 5.0, signalVolts: 4.98 }).verdict).toBe('sensor_open')
    expect(classifySensorCircuit({ refVolts: 5.0, signalVolts: 0.03 }).verdict).toBe('sensor_shorted')
    expect(classifySensorCircuit({ refVolts: 5.0, signalVolts: 2.4 }).verdict).toBe('ok')
    // a measured resistance outranks the signal reading
    expect(classifySensorCircuit({ refVolts: 5.0, signalVolts: 4.98, sensorOhms: 12400, expectedSensor: ectSpec }).verdict).toBe('ok')
    // with no reference the signal is not interpreted
    const noRef = classifySensorCircuit({ refVolts: 0, signalVolts: 0 })
    expect(noRef.verdict).toBe('no_reference')
    expect(noRef.findings[1]).toMatch(/not interpreted/)
  })

  it('rejects NaN, negative ohms and empty input', () => {
    // our own input contract
    expect(() => classifySensorCircuit({ refVolts: Number.NaN })).toThrow(RangeError)
    expect(() => classifySensorCircuit({ sensorOhms: -5 })).toThrow(/negative/)
    expect(() => classifySensorCircuit({ groundOhms: -0.1 })).toThrow(/negative/)
    expect(() => classifySensorCircuit({ sensorOhms: Number.NaN })).toThrow(RangeError)
    expect(() => classifySensorCircuit({ groundDropVolts: Number.NaN })).toThrow(RangeError)
    expect(() => classifySensorCircuit({ refVolts: -5 })).toThrow(/reversed/)
    expect(() => classifySensorCircuit({ refVolts: 5, expectedRefVolts: 0 })).toThrow(RangeError)
    expect(() => classifySensorCircuit({})).toThrow(/No measurement/)
    expect(() => classifySensorCircuit({ sensorOhms: 100, expectedSensor: {} })).toThrow(RangeError)
  })
})
