// Cold-soak comparison: after a long stop, every temperature sensor on an engine should read
// about the same (ambient). The odd one out is suspect. Median and MAD are used rather than
// mean and standard deviation because one wild reading (-40 °C from an open sensor) would drag
// the mean and inflate the deviation enough to hide itself.

export interface LikeSensorItem {
  label: string
  value: number
  deviation: number
  flagged: boolean
}

export interface LikeSensorResult {
  median: number
  mad: number
  threshold: number
  items: LikeSensorItem[]
  outliers: string[]
}

// Scales MAD to a standard deviation for normally distributed readings.
const MAD_TO_SIGMA = 1.4826

function likeMedian(sorted: readonly number[]): number {
  const n = sorted.length
  const mid = Math.floor(n / 2)
  const hi = sorted[mid] ?? NaN
  return n % 2 === 1 ? hi : ((sorted[mid - 1] ?? NaN) + hi) / 2
}

/**
 * Flag readings that sit far from the rest. threshold = max(floor, k · 1.4826 · MAD).
 * The floor stops sensors that agree very closely (MAD near 0) from flagging a normal
 * 1–2 degree spread; defaults floor 5 units and k 3.5 (a common outlier cut-off).
 */
export function compareLikeSensors(
  readings: { label: string, value: number }[],
  opts: { floor?: number, k?: number } = {},
): LikeSensorResult {
  if (!Array.isArray(readings) || readings.length < 3) {
    throw new RangeError('Comparing like sensors needs at least 3 readings')
  }
  const floor = opts.floor ?? 5
  const k = opts.k ?? 3.5
  if (typeof floor !== 'number' || !Number.isFinite(floor) || floor < 0) {
    throw new RangeError(`floor must be a finite number, 0 or more, got ${floor}`)
  }
  if (typeof k !== 'number' || !Number.isFinite(k) || k <= 0) throw new RangeError(`k must be a positive finite number, got ${k}`)
  const labels = new Set<string>()
  for (const r of readings) {
    if (!r || typeof r.value !== 'number' || !Number.isFinite(r.value)) {
      throw new RangeError(`Reading "${r?.label}" must be a finite number, got ${r?.value}`)
    }
    // Outliers are reported by label, so each sensor needs its own.
    if (typeof r.label !== 'string' || !r.label.trim()) throw new RangeError('Every reading needs a label naming its sensor')
    if (labels.has(r.label)) throw new RangeError(`Two readings are both labelled "${r.label}"`)
    labels.add(r.label)
  }
  const values = readings.map(r => r.value)
  const median = likeMedian([...values].sort((a, b) => a - b))
  const mad = likeMedian(values.map(v => Math.abs(v - median)).sort((a, b) => a - b))
  const threshold = Math.max(floor, k * MAD_TO_SIGMA * mad)
  const items = readings.map((r) => {
    const deviation = r.value - median
    return { label: r.label, value: r.value, deviation, flagged: Math.abs(deviation) > threshold }
  })
  return { median, mad, threshold, items, outliers: items.filter(i => i.flagged).map(i => i.label) }
}

// ── When like sensors should agree ─────────────────────────────────────────────────────────
// Sensors agree only when nothing makes them differ: temperatures key on, engine off after a
// cold soak (every part has settled to the air around it); a manifold pressure sensor and the
// barometric one key on, engine off (no boost, so the manifold holds air at the air's pressure).
// Running, they differ by design: exhaust temperatures rise along the after-treatment as the DOC
// and DPF work, coolant and oil run apart, and the turbocharger boosts the manifold.

/** Hours an engine stands off before its temperatures are taken as settled (common practice). */
export const COLD_SOAK_HOURS = 8
/** How far the sensors' median may sit from the measured air after a soak, °C (our default). */
export const AIR_AGREEMENT_C = 5
/** How far apart manifold and barometric pressure may read key on, engine off, kPa (our default, about 1 psi). */
export const MANIFOLD_BARO_KPA = 7
/**
 * Barometric pressures a road can have, kPa: the standard atmosphere gives about 101 kPa at sea
 * level, one kPa less per 100 m of height; below 50 or above 110 a unit mix-up is likelier.
 */
export const BARO_PLAUSIBLE_KPA = { min: 50, max: 110 } as const

export type LiveDataConditions = 'key_off' | 'key_on_engine_off' | 'running'

export interface LikeSensorFit {
  /** ok: compare; warn: compare, but the reasons say why a spread may not mean a bad sensor; refuse: do not compare. */
  verdict: 'ok' | 'warn' | 'refuse'
  reasons: string[]
}

function fitOf(refusals: string[], warnings: string[]): LikeSensorFit {
  if (refusals.length) return { verdict: 'refuse', reasons: refusals }
  return { verdict: warnings.length ? 'warn' : 'ok', reasons: warnings }
}

function conditionRefusal(conditions: LiveDataConditions | undefined, running: string): string | undefined {
  if (conditions === undefined) return 'Say the conditions the values were read in.'
  if (conditions === 'key_off') return 'Live data needs the key on: read the values key on, engine off.'
  if (conditions === 'running') return running
  if (conditions !== 'key_on_engine_off') return `Unknown conditions "${String(conditions)}".`
  return undefined
}

/**
 * Whether temperature sensors read now should agree: key on, engine off, after a soak of at least
 * COLD_SOAK_HOURS, with the air temperature measured. `heatSources`: a block heater, fuel heater or
 * strong sun on the engine (warms some sensors and not others).
 */
export function coldSoakFit(input: {
  conditions?: LiveDataConditions
  soakHours?: number
  airC?: number
  heatSources?: boolean
}): LikeSensorFit {
  const refusals: string[] = []
  const warnings: string[] = []
  const c = conditionRefusal(input.conditions, 'Running, temperatures differ by design: the exhaust heats up along the after-treatment '
    + 'as the DOC and DPF work, and coolant, oil and fuel run apart. Compare temperatures key on, engine off after a cold soak.')
  if (c) refusals.push(c)
  const soak = input.soakHours
  if (soak === undefined || Number.isNaN(soak)) refusals.push('Say how long the engine has been off.')
  else if (!Number.isFinite(soak) || soak < 0) refusals.push(`Hours off must be 0 or more, got ${soak}.`)
  else if (soak < COLD_SOAK_HOURS) {
    warnings.push(`The engine has been off ${soak} h, under ${COLD_SOAK_HOURS} h: the oil, coolant and exhaust cool at different rates, `
      + 'so a spread may be the engine still cooling, not a sensor.')
  }
  const air = input.airC
  if (air === undefined || Number.isNaN(air)) refusals.push('Measure the air temperature near the engine, out of the sun.')
  else if (!Number.isFinite(air) || air < -60 || air > 70) {
    refusals.push(`Air temperature ${air} °C is outside -60…70 °C: check the number and its unit.`)
  }
  if (input.heatSources) {
    warnings.push('A block heater, fuel heater or sun on the engine warms some sensors and not others: '
      + 'unplug it or shade the engine, or expect those sensors to read warm.')
  }
  return fitOf(refusals, warnings)
}

export interface ColdSoakResult extends LikeSensorResult {
  airC: number
  /** median − air, °C */
  medianMinusAir: number
  /** The median lies within AIR_AGREEMENT_C of the air (or the floor given). */
  agreesWithAir: boolean
  airTolerance: number
}

/** compareLikeSensors for temperatures after a soak, with their median also held against the measured air. */
export function compareColdSoak(
  readings: { label: string, value: number }[],
  airC: number,
  opts: { floor?: number, k?: number, airTolerance?: number } = {},
): ColdSoakResult {
  if (typeof airC !== 'number' || !Number.isFinite(airC)) throw new RangeError(`Air temperature must be a finite number, got ${airC}`)
  const airTolerance = opts.airTolerance ?? AIR_AGREEMENT_C
  if (!Number.isFinite(airTolerance) || airTolerance < 0) {
    throw new RangeError(`Air tolerance must be a finite number, 0 or more, got ${airTolerance}`)
  }
  const r = compareLikeSensors(readings, opts)
  const medianMinusAir = r.median - airC
  return { ...r, airC, medianMinusAir, agreesWithAir: Math.abs(medianMinusAir) <= airTolerance + 1e-9, airTolerance }
}

/** Whether manifold and barometric pressure read now should agree: key on, engine off only. */
export function manifoldBaroFit(input: { conditions?: LiveDataConditions }): LikeSensorFit {
  const c = conditionRefusal(input.conditions, 'Running, the turbocharger raises the manifold above the air outside by design: '
    + 'compare the manifold and barometric pressures key on, engine off.')
  return fitOf(c ? [c] : [], [])
}

export interface ManifoldBaroResult {
  /** What the manifold sensor should read with the engine stopped, kPa. */
  expectedKpa: number
  /** manifold − expected, kPa */
  differenceKpa: number
  agrees: boolean
  toleranceKpa: number
  baroPlausible: boolean
}

/**
 * The manifold pressure key on, engine off against the barometric one. Live data shows manifold
 * pressure as absolute (it should equal barometric) or as gauge boost (it should read 0).
 */
export function compareManifoldToBaro(input: {
  manifoldKpa: number
  baroKpa: number
  manifoldReads: 'absolute' | 'gauge'
  toleranceKpa?: number
}): ManifoldBaroResult {
  const { manifoldKpa, baroKpa, manifoldReads } = input
  const toleranceKpa = input.toleranceKpa ?? MANIFOLD_BARO_KPA
  for (const [name, v] of [['Manifold pressure', manifoldKpa], ['Barometric pressure', baroKpa], ['Tolerance', toleranceKpa]] as const) {
    if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`${name} must be a finite number, got ${v}`)
  }
  if (baroKpa <= 0) throw new RangeError(`Barometric pressure is absolute and above 0 kPa, got ${baroKpa}`)
  if (toleranceKpa < 0) throw new RangeError(`Tolerance cannot be negative, got ${toleranceKpa}`)
  if (manifoldReads !== 'absolute' && manifoldReads !== 'gauge') {
    throw new RangeError(`Manifold pressure reads 'absolute' or 'gauge', got ${String(manifoldReads)}`)
  }
  const expectedKpa = manifoldReads === 'absolute' ? baroKpa : 0
  const differenceKpa = manifoldKpa - expectedKpa
  return {
    expectedKpa, differenceKpa, toleranceKpa,
    agrees: Math.abs(differenceKpa) <= toleranceKpa + 1e-9,
    baroPlausible: baroKpa >= BARO_PLAUSIBLE_KPA.min && baroKpa <= BARO_PLAUSIBLE_KPA.max,
  }
}

// ── What a reading can say about the circuit ───────────────────────────────────────────────

/**
 * −40 °C is the bottom of a one-byte J1939 temperature (1 °C per bit from −40 °C: coolant,
 * fuel, intake manifold air). An NTC thermistor's resistance rises as it cools, so an open NTC
 * circuit looks colder than anything the scale holds and the controller sends −40 °C. A platinum
 * RTD (the usual exhaust-temperature sensor) works the other way: open, it reads hot.
 */
export function coldestScaleHint(valueC: number): string | undefined {
  if (typeof valueC !== 'number' || !Number.isFinite(valueC)) return undefined
  if (Math.abs(valueC + 40) > 0.5) return undefined
  return '−40 °C is the bottom of a one-byte J1939 temperature: an NTC sensor sent that way (coolant, fuel, intake manifold air) '
    + 'often reads this when its circuit is open. Check the connector and wiring before the sensor.'
}

export const SENSOR_TYPE_NOTES: readonly string[] = [
  '−40 °C points to a circuit fault only for NTC thermistor sensors whose temperature travels as one byte on J1939 '
  + '(coolant, fuel, intake manifold air): an open NTC circuit reads colder than that scale holds, '
  + 'so it often shows its lowest value, −40 °C.',
  'A platinum RTD exhaust-temperature sensor works the other way: its resistance rises with heat, so an open RTD or wire reads hot '
  + '(often the top of its range), and a short reads cold.',
  'Two-byte J1939 temperatures (exhaust, after-treatment, engine oil) reach far below −40 °C: an open sensor there shows some other value.',
]
