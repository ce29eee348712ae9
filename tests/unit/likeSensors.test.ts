import { describe, expect, it } from 'vitest'
import { compareLikeSensors } from '../../shared/utils/likeSensors'

describe('compareLikeSensors', () => {
  it('flags the open sensor reading -40 °C when the rest read 9–15 °C', () => {
    // common practice: after a cold soak all engine temperature sensors read near ambient;
    // -40 °C is the classic open-thermistor reading
    const r = compareLikeSensors([
      { label: 'coolant', value: 12 },
      { label: 'oil', value: 11 },
      { label: 'fuel', value: 13 },
      { label: 'intake air', value: 9 },
      { label: 'ambient', value: 15 },
      { label: 'EGR cooler', value: -40 },
    ])
    // median of (-40, 9, 11, 12, 13, 15) = 11.5; MAD = median(0.5,0.5,1.5,2.5,3.5,51.5) = 2 (arithmetic)
    expect(r.median).toBe(11.5)
    expect(r.mad).toBe(2)
    // threshold = max(5, 3.5 × 1.4826 × 2) = 10.3782 (Iglewicz–Hoaglin style cut-off, common practice)
    expect(Math.abs(r.threshold - 10.3782)).toBeLessThan(1e-9)
    expect(r.outliers).toEqual(['EGR cooler'])
    const egr = r.items.find(i => i.label === 'EGR cooler')
    expect(egr?.deviation).toBe(-51.5)
    expect(egr?.flagged).toBe(true)
    expect(r.items.filter(i => i.flagged)).toHaveLength(1)
  })

  it('four like sensors: one at -40 °C, three at 9–15 °C; only the -40 °C one is flagged, by 50.5 °C', () => {
    // common practice: -40 °C is the floor many controllers report for an open sensor circuit
    const r = compareLikeSensors([
      { label: 'coolant', value: 9 },
      { label: 'oil', value: 12 },
      { label: 'intake air', value: 15 },
      { label: 'fuel', value: -40 },
    ])
    // arithmetic: median (9 + 12)/2 = 10.5; deviations 1.5, 1.5, 4.5, 50.5 -> MAD 3;
    // threshold max(5, 3.5 × 1.4826 × 3) = 15.5673
    expect(r.median).toBe(10.5)
    expect(r.mad).toBe(3)
    expect(Math.abs(r.threshold - 15.5673)).toBeLessThan(1e-9)
    expect(r.outliers).toEqual(['fuel'])
    expect(r.items.find(i => i.label === 'fuel')?.deviation).toBe(-50.5)
  })

  it('flags nothing when all agree', () => {
    // common practice: a 1–2 °C spread between like sensors is normal
    const r = compareLikeSensors([
      { label: 'a', value: 11 },
      { label: 'b', value: 12 },
      { label: 'c', value: 12.5 },
      { label: 'd', value: 13 },
    ])
    // median (12 + 12.5)/2 = 12.25; MAD 0.5; threshold held at the 5-unit floor (arithmetic)
    expect(r.median).toBe(12.25)
    expect(r.mad).toBe(0.5)
    expect(r.threshold).toBe(5)
    expect(r.outliers).toEqual([])
  })

  it('the floor keeps identical readings from flagging a small step', () => {
    // common practice: MAD of 0 would otherwise flag any difference at all
    const r = compareLikeSensors([
      { label: 'a', value: 20 },
      { label: 'b', value: 20 },
      { label: 'c', value: 20 },
      { label: 'd', value: 23 },
    ])
    expect(r.mad).toBe(0)
    expect(r.outliers).toEqual([])
    expect(compareLikeSensors([{ label: 'a', value: 20 }, { label: 'b', value: 20 }, { label: 'c', value: 26 }]).outliers).toEqual(['c'])
  })

  it('works with three readings and honours options', () => {
    // arithmetic: median 10, MAD 1, threshold max(5, 3.5·1.4826) = 5.19
    expect(compareLikeSensors([{ label: 'x', value: 10 }, { label: 'y', value: 11 }, { label: 'z', value: -40 }]).outliers).toEqual(['z'])
    // arithmetic: with floor 0.5 and k 1, threshold = max(0.5, 1.4826·0.5) = 0.7413;
    // from the median 12.25, 11 deviates 1.25 and 13 deviates 0.75 (both over), 12 and 12.5 deviate 0.25
    const r = compareLikeSensors([{ label: 'a', value: 11 }, { label: 'b', value: 12 }, { label: 'c', value: 12.5 }, { label: 'd', value: 13 }], { floor: 0.5, k: 1 })
    expect(Math.abs(r.threshold - 0.7413)).toBeLessThan(1e-9)
    expect(r.outliers).toEqual(['a', 'd'])
  })

  it('rejects too few readings, NaN and bad options', () => {
    // our own input contract
    expect(() => compareLikeSensors([{ label: 'a', value: 1 }, { label: 'b', value: 2 }])).toThrow(/at least 3/)
    expect(() => compareLikeSensors([{ label: 'a', value: 1 }, { label: 'b', value: Number.NaN }, { label: 'c', value: 2 }])).toThrow(/"b"/)
    expect(() => compareLikeSensors([{ label: 'a', value: 1 }, { label: 'b', value: Infinity }, { label: 'c', value: 2 }])).toThrow(RangeError)
    expect(() => compareLikeSensors([{ label: '', value: 1 }, { label: 'b', value: 2 }, { label: 'c', value: 3 }])).toThrow(/label/)
    expect(() => compareLikeSensors([{ label: 'a', value: 1 }, { label: 'a', value: 2 }, { label: 'c', value: 3 }])).toThrow(/both labelled "a"/)
    const ok = [{ label: 'a', value: 1 }, { label: 'b', value: 2 }, { label: 'c', value: 3 }]
    expect(() => compareLikeSensors(ok, { floor: -1 })).toThrow(RangeError)
    expect(() => compareLikeSensors(ok, { k: 0 })).toThrow(RangeError)
    expect(() => compareLikeSensors(ok, { k: Number.NaN })).toThrow(RangeError)
  })
})
