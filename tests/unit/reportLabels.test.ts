import { describe, expect, it } from 'vitest'
import { REPORT_NAMES } from '../../shared/schemas/reports'
import { CALL_OUTCOMES } from '../../shared/utils/callStatus'
import { isMeasureColumn, REPORTS, reportCellText } from '../../shared/utils/reportLabels'

describe('the report label registry', () => {
  it('names every report and column in words: no column keys, enum values or Title Case of either', () => {
    for (const name of REPORT_NAMES) {
      const spec = REPORTS[name]
      for (const text of [spec.title, spec.about, ...spec.columns.map(c => c.label)]) {
        expect(text).not.toMatch(/_|[a-z][A-Z]|\bMin\b|Cents/)
        expect(text).toMatch(/^[A-Z]/)
      }
      // The chart draws columns the report has, and only measures.
      const keys = spec.columns.map(c => c.key)
      expect(keys).toContain(spec.chart.x)
      for (const s of spec.chart.series) expect(isMeasureColumn(spec.columns.find(c => c.key === s)!)).toBe(true)
    }
  })

  it('reads every call outcome as words', () => {
    const outcome = REPORTS['fix-rate'].columns.find(c => c.key === 'outcome')!
    for (const o of CALL_OUTCOMES) expect(reportCellText(outcome, o)).not.toContain('_')
    expect(reportCellText(outcome, 'no_fault_found')).toBe('No fault found')
  })

  it('writes amounts for people: dollars from cents, percentages, call numbers, a dash for nothing', () => {
    const col = (key: string) => REPORTS['mechanic-weeks'].columns.find(c => c.key === key)!
    expect(reportCellText(col('revenueCents'), 4_200_050)).toBe('$42,000.50')
    expect(reportCellText(col('firstVisitFixPct'), 33.3333)).toBe('33.3 %')
    expect(reportCellText(col('laborHours'), 3)).toBe('3.0 h')
    expect(reportCellText(col('firstVisitFixPct'), null)).toBe('—')
    expect(reportCellText(REPORTS.comebacks.columns.find(c => c.key === 'firstCall')!, 1042)).toBe('#1042')
  })
})
