// Steps that work a verdict out of several numbers: an air-brake leak rate, a battery's state of
// charge or load test, a tire's tread depth or pressure. Each calculation names its inputs (for
// the phone's form) and answers a value, a verdict and the working in words.
import type { CardCalc } from '../schemas/testCards'
import { airLeakRate, airLeakVerdict } from './air'
import { batteryStateOfCharge } from './battery'
import { fmtNumber } from './cardSpec'

export interface CalcInput {
  id: string
  label: string
  /** 'number' inputs are typed on the keypad; 'yes_no' and 'choice' ones are buttons. */
  kind: 'number' | 'yes_no' | 'choice'
  options?: readonly string[]
  /** Unit symbol shown beside a number; a temperature is typed in °C or °F and given here in °C. */
  unit?: string
  temperature?: boolean
  min?: number
  max?: number
  hint?: string
}

export interface CalcResult {
  value: number
  unit: string
  verdict: 'pass' | 'low' | 'high'
  /** The working, e.g. 'lost 3 psi in 60 s: 3 psi/min, brakes applied, single vehicle; pass' */
  text: string
}

export type CalcInputs = Record<string, number | string>

// Load test: the least voltage after 15 s at half the cold-cranking rating, by battery temperature
// (the battery industry's load-test table, °F rows; from memory, see REFERENCES.md). A battery
// between rows is judged by the colder row, so a good battery is never failed by rounding.
export const LOAD_TEST_ROWS: readonly (readonly [number, number])[] = [
  [70, 9.6], [60, 9.5], [50, 9.4], [40, 9.3], [30, 9.1], [20, 8.9], [10, 8.7], [0, 8.5],
]
// 49 CFR 393.75(b) and (c): tread depth in a major groove, 32nds of an inch.
export const TREAD_MIN_32NDS = { steer: 4, other: 2 } as const
// Cranking circuit: total drop across both cables at cranking load (REFERENCES.md §7, a US Army
// technical manual's engine cable test): under 0.5 V on 12 V, under 1.0 V on 24 V.
export const CABLE_DROP_MAX = { 12: 0.5, 24: 1.0 } as const
const packName = (systemVolts: 12 | 24) => (systemVolts === 24 ? '24 V pair' : '12 V battery')
const SYSTEM: CalcInput = { id: 'system', label: 'System voltage', kind: 'choice', options: ['12 V', '24 V'] }
const systemOf = (inputs: CalcInputs): 12 | 24 => {
  if (inputs.system !== '12 V' && inputs.system !== '24 V') throw new RangeError('Pick the system voltage: 12 V or 24 V')
  return inputs.system === '24 V' ? 24 : 12
}
// A tire run below this share of its cold inflation pressure is demounted and inspected before
// it is aired up again, in a cage (common practice in tire service).
export const INFLATION_MIN_PCT = 80

export function calcInputs(calc: CardCalc): CalcInput[] {
  switch (calc.fn) {
    case 'air_leak':
      return [
        { id: 'startPsi', label: 'Pressure at the start', kind: 'number', unit: 'psi', min: 0, max: 200 },
        { id: 'endPsi', label: 'Pressure at the end', kind: 'number', unit: 'psi', min: 0, max: 200 },
        { id: 'seconds', label: 'Time between them', kind: 'number', unit: 's', min: 1, max: 900, hint: 'One minute (60 s) is usual' },
        { id: 'combination', label: 'Is a trailer coupled (a combination vehicle)?', kind: 'yes_no' },
      ]
    case 'battery_soc':
      return [{ id: 'volts', label: `Resting voltage (${packName(calc.systemVolts)})`, kind: 'number', unit: 'V', min: 0, max: 40 }]
    case 'battery_load':
      return [
        { id: 'volts', label: 'Voltage after 15 s on the load', kind: 'number', unit: 'V', min: 0, max: 20 },
        {
          id: 'tempC', label: 'Battery temperature', kind: 'number', temperature: true, min: -40, max: 60,
          hint: 'Of the battery itself: its case, or the air where it has stood for hours',
        },
      ]
    case 'system_volts':
      return [SYSTEM, { id: 'volts', label: calc.label, kind: 'number', unit: 'V', min: 0, max: 40 }]
    case 'cable_drop':
      return [
        SYSTEM,
        { id: 'posDrop', label: 'Drop, battery positive post to the starter’s terminal', kind: 'number', unit: 'V', min: 0, max: 30 },
        { id: 'negDrop', label: 'Drop, battery negative post to the starter’s housing', kind: 'number', unit: 'V', min: 0, max: 30 },
      ]
    case 'tread_depth':
      return [
        { id: 'steer', label: 'Is it a steer tire (front axle)?', kind: 'yes_no' },
        {
          id: 'depth32', label: 'Tread depth in a major groove', kind: 'number', unit: '/32 in', min: 0, max: 40,
          hint: 'Shallowest reading, not on a tread-wear bar',
        },
      ]
    case 'inflation':
      return [
        { id: 'psi', label: 'Pressure now', kind: 'number', unit: 'psi', min: 0, max: 200 },
        {
          id: 'coldPsi', label: 'Cold inflation pressure for this tire', kind: 'number', unit: 'psi', min: 1, max: 200,
          hint: 'From the fleet’s spec or the load-and-inflation table, not the sidewall maximum',
        },
      ]
  }
}

function numberIn(inputs: CalcInputs, def: CalcInput): number {
  const v = inputs[def.id]
  if (typeof v !== 'number' || !Number.isFinite(v)) throw new RangeError(`Enter ${def.label.toLowerCase()}`)
  if ((def.min !== undefined && v < def.min) || (def.max !== undefined && v > def.max)) {
    const shown = `${fmtNumber(v)}${def.unit ? ` ${def.unit}` : ''}`
    throw new RangeError(`${def.label} ${shown} is outside ${def.min}…${def.max}: check the number`)
  }
  return v
}
function yesNoIn(inputs: CalcInputs, def: CalcInput): boolean {
  const v = inputs[def.id]
  if (v !== 'yes' && v !== 'no') throw new RangeError(`Answer: ${def.label}`)
  return v === 'yes'
}

/** Works a calculation step out; throws naming the input that is missing or out of range. */
export function runCalc(calc: CardCalc, inputs: CalcInputs): CalcResult {
  if (!inputs || typeof inputs !== 'object') throw new RangeError('Enter the numbers first')
  const defs = Object.fromEntries(calcInputs(calc).map(d => [d.id, d]))
  const n = (id: string) => numberIn(inputs, defs[id]!)
  switch (calc.fn) {
    case 'air_leak': {
      const [start, end, s] = [n('startPsi'), n('endPsi'), n('seconds')]
      const combination = yesNoIn(inputs, defs.combination!)
      if (end > start) {
        throw new RangeError('The pressure rose during the test: the compressor was still charging; stop the engine and start again')
      }
      const rate = airLeakRate(start, end, s)
      const verdict = airLeakVerdict({ psiPerMin: rate, brakes: calc.brakes, combination }) === 'pass' ? 'pass' : 'high'
      const vehicle = combination ? 'combination vehicle' : 'single vehicle'
      return {
        value: rate, unit: 'psi/min', verdict,
        text: `lost ${fmtNumber(start - end)} psi in ${fmtNumber(s)} s: ${fmtNumber(rate)} psi/min `
          + `with the brakes ${calc.brakes}, ${vehicle}; `
          + (verdict === 'pass' ? 'pass' : 'leaks too fast'),
      }
    }
    case 'battery_soc': {
      const v = n('volts')
      const pct = batteryStateOfCharge(v, calc.systemVolts)
      const verdict = pct >= calc.minPct ? 'pass' : 'low'
      return {
        value: pct, unit: '%', verdict,
        text: `${fmtNumber(v)} V at rest on a ${packName(calc.systemVolts)}: about ${Math.round(pct)} % charged; `
          + `at least ${calc.minPct} % wanted; ${verdict}`,
      }
    }
    case 'battery_load': {
      const [v, tempC] = [n('volts'), n('tempC')]
      const tempF = (tempC * 9) / 5 + 32
      if (tempF < 0) throw new RangeError('The battery is below 0 °F (−18 °C): warm it before a load test')
      const row = LOAD_TEST_ROWS.find(([f]) => tempF >= f)!
      const verdict = v >= row[1] ? 'pass' : 'low'
      return {
        value: v, unit: 'V', verdict,
        text: `${fmtNumber(v)} V after 15 s on the load with the battery at ${fmtNumber(tempC)} °C: `
          + `at least ${row[1]} V wanted at ${row[0]} °F and above; ${verdict}`,
      }
    }
    case 'system_volts': {
      const sys = systemOf(inputs)
      const v = n('volts')
      const k = sys / 12
      const [lo, hi] = [calc.min12 === undefined ? undefined : calc.min12 * k, calc.max12 === undefined ? undefined : calc.max12 * k]
      const verdict = lo !== undefined && v < lo ? 'low' : hi !== undefined && v > hi ? 'high' : 'pass'
      let want = lo !== undefined ? `at least ${fmtNumber(lo)} V` : `at most ${fmtNumber(hi!)} V`
      if (lo !== undefined && hi !== undefined) want = `${fmtNumber(lo)}–${fmtNumber(hi)} V`
      return { value: v, unit: 'V', verdict, text: `${fmtNumber(v)} V on a ${sys} V system: ${want} wanted; ${verdict}` }
    }
    case 'cable_drop': {
      const sys = systemOf(inputs)
      const [pos, neg] = [n('posDrop'), n('negDrop')]
      const total = pos + neg
      const most = CABLE_DROP_MAX[sys]
      const verdict = total < most ? 'pass' : 'high'
      const worse = pos >= neg ? 'positive' : 'negative'
      return {
        value: total, unit: 'V', verdict,
        text: `${fmtNumber(pos)} V + ${fmtNumber(neg)} V = ${fmtNumber(total)} V across the cranking cables on a ${sys} V system: `
          + `under ${most} V wanted; `
          + (verdict === 'pass' ? 'pass' : `too much, most of it on the ${worse} side`),
      }
    }
    case 'tread_depth': {
      const steer = yesNoIn(inputs, defs.steer!)
      const d = n('depth32')
      const least = TREAD_MIN_32NDS[steer ? 'steer' : 'other']
      const verdict = d >= least ? 'pass' : 'low'
      const where = steer ? 'a steer tire' : 'a tire not on the steer axle'
      const text = `${fmtNumber(d)}/32 in on ${where}: at least ${least}/32 in (49 CFR 393.75); `
        + (verdict === 'pass' ? 'pass' : 'too shallow')
      return { value: d, unit: '/32 in', verdict, text }
    }
    case 'inflation': {
      const [psi, cold] = [n('psi'), n('coldPsi')]
      const pct = (psi / cold) * 100
      const verdict = pct >= INFLATION_MIN_PCT ? 'pass' : 'low'
      return {
        value: pct, unit: '%', verdict,
        text: `${fmtNumber(psi)} psi against ${fmtNumber(cold)} psi cold: ${Math.round(pct)} %; `
          + `below ${INFLATION_MIN_PCT} % it is demounted before airing up; ${verdict === 'pass' ? 'pass' : 'run flat'}`,
      }
    }
  }
}
