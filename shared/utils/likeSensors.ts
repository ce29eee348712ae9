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
  if (typeof floor !== 'number' || !Number.isFinite(floor) || floor < 0) throw new RangeError(`floor must be a finite number, 0 or more, got ${floor}`)
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
