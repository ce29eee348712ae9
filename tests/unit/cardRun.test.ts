import { describe, expect, it } from 'vitest'
import { cardDefinitionSchema } from '../../shared/schemas/testCards'
import {
  OL_OHMS, currentStep, judgeStep, readingText, recordAnswer, recordCalc, recordReading, runReadingRecords, runRecord, shownVerdict,
  specPreview, startRun, targetText, undoLast, type CardRun,
} from '../../shared/utils/cardRun'
import { SEED_CARDS } from '../../server/db/seed/cards'

const def = (slug: string) => cardDefinitionSchema.parse(SEED_CARDS.find(c => c.slug === slug)!.definition)
const at = '2026-03-01T10:00:00.000Z'
const start = (slug: string, version = 1) => startRun({ id: 'run-1', callId: 'call-5',
  card: { id: `card-${slug}`, version, definition: def(slug) }, at,
})
const yes = (run: CardRun) => recordAnswer(run, { answer: 'yes', at })
const no = (run: CardRun) => recordAnswer(run, { answer: 'no', at })
// IEC 60751 Pt100 table as printed, ×2 for a Pt200 (REFERENCES §1): 12 °C 104.68 → 209.36 Ω; 20 °C 107.79 → 215.58 Ω.
const C = (value: number) => ({ value, unit: 'degC' as const })

describe('the exhaust-temperature card', () => {
  it('starts with a look at the wiring, then the unplug-and-jumper test with live data', () => {
    // our own card: a look first, then live data
    const run = start('egt-rtd-sensor')
    expect(currentStep(run)?.id).toBe('look')
    expect(currentStep(yes(run))?.id).toBe('unplugged')
    expect(currentStep(yes(yes(run)))?.id).toBe('jumpered')
    expect(no(run).conclusionId).toBe('repair-found')
  })

  it('live data proves the circuit; a low sensor at its own temperature, settled, with a good new part: replace the sensor', () => {
    let run = yes(yes(yes(start('egt-rtd-sensor'))))
    const step = currentStep(run)!
    expect(step.id).toBe('sensor-ohms')
    // the spec waits for the part's temperature
    expect(specPreview(step, 'ohm')).toBe('Enter the part’s temperature to see what it should read')
    // IEC 60751 ×2: 12 °C 209.4 Ω; ± 10 °C through the curve (2 °C → 201.6 Ω, 22 °C → 217.1 Ω)
    expect(specPreview(step, 'ohm', 'degC', 12)).toBe('A Pt200 at 12 °C should read 209.4 Ω (201.6–217.1 Ω for ± 10 °C)')
    expect(() => recordReading(run, { value: 118, unit: 'ohm', readingId: 'rd-1', at })).toThrow(/part’s temperature/)
    run = recordReading(run, { value: 118, unit: 'ohm', readingId: 'rd-1', at, partTemp: C(12) })
    expect(run.results.at(-1)).toMatchObject({
      verdict: 'low', partTempC: 12, next: 'settled',
      explanation: 'measured 118 Ω; a Pt200 at 12 °C should read 209.4 Ω (201.6–217.1 Ω for ± 10 °C); low',
    })
    // a part that may still be warm is asked about before anything is replaced
    expect(currentStep(run)?.id).toBe('settled')
    run = yes(run)
    expect(currentStep(run)?.partRole).toBe('new')
    // the new part out of its box at 20 °C: IEC ×2 215.58 Ω; typed in kΩ (SI prefix k = 10³)
    run = recordReading(run, { value: 0.2156, unit: 'kohm', readingId: 'rd-2', at, partTemp: { value: 68, unit: 'degF' } })
    expect(run.results.at(-1)).toMatchObject({ value: expect.closeTo(215.6, 9), verdict: 'pass', partTempC: 20 })
    expect(run.conclusionId).toBe('replace-sensor')
    expect(targetText(run, 'replace-sensor')).toEqual({ kind: 'conclusion', text: 'Replace the exhaust temperature sensor' })

    const rec = runRecord(run)
    expect(rec).toMatchObject({
      id: 'run-1', callId: 'call-5', cardId: 'card-egt-rtd-sensor', cardVersion: 1, conclusion: 'Replace the exhaust temperature sensor',
    })
    expect(rec.ambientC).toBeUndefined()
    const readings = runReadingRecords(run)
    expect(readings.map(r => [r.id, r.testRunId, r.partRole, r.value, r.unit, r.verdict, r.conditions])).toEqual([
      ['rd-1', 'run-1', 'installed', 118, 'ohm', 'low', 'key_off'],
      ['rd-2', 'run-1', 'new', expect.closeTo(215.6, 9), 'ohm', 'pass', 'key_off'],
    ])
    expect(readings[0]?.spec).toMatchObject({ partTempC: 12, text: '201.6–217.1 Ω' })
  })

  it('a sensor still cooling is measured again, not replaced', () => {
    // our own card: the warm-part question loops back to the measurement
    let run = yes(yes(yes(start('egt-rtd-sensor'))))
    run = recordReading(run, { value: 240, unit: 'ohm', readingId: 'a', at, partTemp: C(12) })
    run = no(run)
    expect(currentStep(run)?.id).toBe('sensor-ohms')
    // IEC 60751 ×2 at 40 °C: 2 × 115.54 = 231.08 Ω, inside 40 ± 10 °C
    run = recordReading(run, { value: 231.1, unit: 'ohm', readingId: 'b', at, partTemp: C(40) })
    expect(run.conclusionId).toBe('circuit-good')
  })

  it('live data that does not follow leads through every wire test before the controller', () => {
    // REFERENCES §7: 5 V supply 4.8–5.2 V; common practice: 0 V on a wire open at both ends, over 100 kΩ to chassis,
    // 1 Ω end to end, 0.1 V drop
    let run = no(yes(start('egt-rtd-sensor')))
    expect(currentStep(run)?.id).toBe('ref-return')
    run = recordReading(run, { value: 5.02, unit: 'V', readingId: 'a', at })
    const chain = ['signal-power', 'signal-chassis', 'signal-ohms', 'return-ohms', 'return-drop']
    const good = [
      { value: 0, unit: 'V' }, { value: 'OL', unit: 'ohm' }, { value: 0.3, unit: 'ohm' },
      { value: 0.4, unit: 'ohm' }, { value: 0.02, unit: 'V' },
    ] as const
    chain.forEach((id, i) => {
      expect(currentStep(run)?.id).toBe(id)
      run = recordReading(run, { ...good[i]!, readingId: `w${i}`, at })
    })
    expect(run.conclusionId).toBe('controller')
  })

  it('a high supply goes straight to the short-to-power test, and a live signal wire ends at its repair', () => {
    // REFERENCES §7: above 5.2 V is high; common practice: any voltage on a wire open at both ends means it touches a live one
    let run = no(yes(start('egt-rtd-sensor')))
    run = recordReading(run, { value: 7.9, unit: 'V', readingId: 'a', at })
    expect(currentStep(run)?.id).toBe('signal-power')
    run = recordReading(run, { value: 11.8, unit: 'V', readingId: 'b', at })
    expect(run.conclusionId).toBe('repair-short-power')
    // a chafe to chassis: 2 kΩ is under the 100 kΩ limit
    let g = no(yes(start('egt-rtd-sensor')))
    g = recordReading(g, { value: 0.4, unit: 'V', readingId: 'a', at })
    expect(currentStep(g)?.id).toBe('ref-battery')
    g = recordReading(g, { value: 0.4, unit: 'V', readingId: 'b', at })
    g = recordReading(g, { value: 0, unit: 'V', readingId: 'c', at })
    g = recordReading(g, { value: 2, unit: 'kohm', readingId: 'd', at })
    expect(g.conclusionId).toBe('repair-short-ground')
    // OL is stored as OL_OHMS (JSON has no Infinity) and shown as OL again
    expect(readingText(OL_OHMS, 'ohm')).toBe('OL (open)')
  })

  it('measure again takes back the last step until the run is saved', () => {
    // our own rule
    let run = yes(start('egt-rtd-sensor'))
    run = undoLast(run)
    expect(run.results).toEqual([])
    expect(run.currentStepId).toBe('look')
    const done = recordAnswer(start('egt-rtd-sensor'), { answer: 'no', at })
    expect(undoLast(done).conclusionId).toBeUndefined()
    expect(() => undoLast({ ...done, saved: { run: true, readings: [] } })).toThrow(/saved/)
  })

  it('refuses entries that make no sense for the step', () => {
    // our own input contract
    const run = yes(yes(yes(start('egt-rtd-sensor'))))
    expect(() => recordReading(run, { value: 5, unit: 'V', readingId: 'a', at, partTemp: C(20) })).toThrow(/does not measure/)
    expect(() => recordReading(run, { value: -5, unit: 'ohm', readingId: 'a', at, partTemp: C(20) })).toThrow(/negative/)
    expect(() => recordReading(run, { value: Number.NaN, unit: 'ohm', readingId: 'a', at, partTemp: C(20) })).toThrow(RangeError)
    expect(() => recordReading(run, { value: 200, unit: 'ohm', readingId: 'a', at, partTemp: C(2000) })).toThrow(/outside/)
    expect(() => recordAnswer(run, { answer: 'yes', at })).toThrow(/reading/)
    expect(() => recordCalc(run, { inputs: {}, readingId: 'x', at })).toThrow(/not numbers/)
    expect(() => runRecord(run)).toThrow(/conclusion/)
  })
})

describe('the coolant card without the maker’s data', () => {
  it('records the sensor reading with its temperature but gives no verdict, and asks for the data', () => {
    // our own rule (DESIGN.md): a card without the maker's data asks for it instead of judging
    let run = yes(yes(yes(start('coolant-temp-ntc'))))
    const step = currentStep(run)!
    expect(specPreview(step, 'ohm')).toMatch(/^Reading recorded but not judged: this card needs the maker’s data/)
    run = recordReading(run, { value: 3.1, unit: 'kohm', readingId: 'r', at, partTemp: C(21) })
    expect(run.results.at(-1)).toMatchObject({ verdict: 'unjudged', partTempC: 21 })
    expect(run.results.at(-1)?.explanation).toBe('measured 3.1 kΩ at 21 °C; not judged: this card needs the maker’s data for '
      + 'this coolant temperature sensor '
      + '(the maker’s table of resistance by temperature, or Beta and R25). Ask the office to enter it in the card editor')
    expect(shownVerdict(run.results.at(-1)!)).toBe('unjudged')
    expect(run.conclusionId).toBe('not-judged')
    const [reading] = runReadingRecords(run)
    expect(reading).toMatchObject({ value: 3100, unit: 'ohm', spec: { partTempC: 21 } })
    expect(reading!.verdict).toBeUndefined()
  })
})

describe('worked-out and pick-one steps', () => {
  it('air brakes: the leak rate from the gauge and the time, against the CDL manual’s limits', () => {
    // Model CDL manual air-brake check: released ≤ 2 psi/min single, ≤ 3 combination; applied ≤ 3 single, ≤ 4 combination
    let run = yes(yes(start('air-brakes')))
    expect(currentStep(run)?.id).toBe('leak-released')
    run = recordCalc(run, { inputs: { startPsi: 120, endPsi: 117.5, seconds: 60, combination: 'yes' }, readingId: 'l1', at })
    expect(run.results.at(-1)).toMatchObject({ value: 2.5, unit: 'psi/min', verdict: 'pass' })
    // applied, single vehicle: 4 psi lost in a minute is over 3
    run = recordCalc(run, { inputs: { startPsi: 110, endPsi: 106, seconds: 60, combination: 'no' }, readingId: 'l2', at })
    expect(run.results.at(-1)).toMatchObject({ value: 4, verdict: 'high' })
    expect(run.conclusionId).toBe('find-leak-applied')
    expect(runReadingRecords(run).map(r => [r.quantity, r.unit, r.value, r.verdict]))
      .toEqual([['other', 'psi/min', 2.5, 'pass'], ['other', 'psi/min', 4, 'high']])
    expect(() => recordCalc(yes(yes(start('air-brakes'))), { inputs: { startPsi: 100, endPsi: 110, seconds: 60, combination: 'no' }, readingId: 'x', at })).toThrow(/rose/)
  })

  it('battery: state of charge from the resting voltage, then the tester the mechanic has', () => {
    // a battery maker's 80 °F table (REFERENCES §7): 12.45 V is 75 %, 12.24 V is 50 %
    let run = yes(start('battery-charging'))
    expect(recordCalc(run, { inputs: { volts: 12.24 }, readingId: 's', at }).conclusionId).toBe('charge-first')
    run = recordCalc(run, { inputs: { volts: 12.45 }, readingId: 's', at })
    expect(run.results.at(-1)).toMatchObject({ value: 75, verdict: 'pass' })
    // a question only picks the way on: answered, no verdict shown
    const conductance = recordAnswer(run, { answer: 'Conductance tester', at })
    expect(shownVerdict(conductance.results.at(-1)!)).toBe('answered')
    expect(currentStep(conductance)?.id).toBe('conductance')
    expect(recordAnswer(conductance, { answer: 'Charge and retest', at }).conclusionId).toBe('charge-first')
    expect(recordAnswer(conductance, { answer: 'Bad cell', at }).conclusionId).toBe('replace-battery')
    // load test, battery at 10 °C (50 °F): at least 9.4 V (load-test table, from memory)
    const load = recordAnswer(run, { answer: 'Load tester', at })
    expect(recordCalc(load, { inputs: { volts: 9.45, tempC: 10 }, readingId: 'l', at }).conclusionId).toBe('battery-good')
    expect(recordCalc(load, { inputs: { volts: 9.35, tempC: 10 }, readingId: 'l', at }).conclusionId).toBe('replace-battery')
  })

  it('DEF: a reading just outside takes a second sample before any draining', () => {
    // ISO 22241-1 (REFERENCES §8): 31.8–33.2 %; refractometer ± 0.5 % (common practice)
    const toPct = yes(yes(yes(start('def-concentration'))))
    const marginal = recordReading(toPct, { value: 31.5, unit: 'pct', readingId: 'p', at })
    expect(currentStep(marginal)?.id).toBe('second-pct')
    expect(recordReading(marginal, { value: 32.1, unit: 'pct', readingId: 'q', at }).conclusionId).toBe('def-ok')
    expect(recordReading(marginal, { value: 31.6, unit: 'pct', readingId: 'q', at }).conclusionId).toBe('lab-check')
    expect(recordReading(toPct, { value: 26, unit: 'pct', readingId: 'p', at }).conclusionId).toBe('diluted')
    expect(recordReading(toPct, { value: 34.4, unit: 'pct', readingId: 'p', at }).conclusionId).toBe('too-strong')
    expect(recordAnswer(start('def-concentration'), { answer: 'no', at }).conclusionId).toBe('contaminated')
    // a run keeps the card version it started with
    expect(runRecord(recordAnswer(start('def-concentration', 3), { answer: 'no', at })).cardVersion).toBe(3)
  })

  it('judgeStep is the one judge for the phone and the server', () => {
    // IEC 60751 ×2 at 20 °C: 215.58 Ω passes
    const step = def('egt-rtd-sensor').steps.find(s => s.id === 'sensor-ohms')!
    expect(judgeStep(step, { reading: { value: 215.6, unit: 'ohm' }, partTemp: C(20) }))
      .toMatchObject({ verdict: 'pass', next: 'circuit-good' })
  })
})
