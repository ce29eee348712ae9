import { z } from 'zod'

export const REPORT_NAMES = ['calls-per-day', 'response-times', 'fix-rate', 'comebacks', 'revenue', 'parts'] as const
export type ReportName = (typeof REPORT_NAMES)[number]

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, 'Use a date like 2026-03-31').refine(s => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), 'Not a real date')

/** `?from=&to=` (inclusive ISO dates); the last 30 days when left out. */
export const reportRangeSchema = z.object({
  from: isoDate.optional(),
  to: isoDate.optional(),
}).transform((v, ctx) => {
  const to = v.to ?? new Date().toISOString().slice(0, 10)
  const from = v.from ?? new Date(Date.parse(`${to}T00:00:00Z`) - 29 * 86_400_000).toISOString().slice(0, 10)
  if (from > to) {
    ctx.addIssue({ code: 'custom', path: ['from'], message: 'From must be on or before to' })
    return z.NEVER
  }
  if (Date.parse(to) - Date.parse(from) > 366 * 86_400_000) {
    ctx.addIssue({ code: 'custom', path: ['from'], message: 'Pick at most a year' })
    return z.NEVER
  }
  return { from, to }
})
export type ReportRange = z.output<typeof reportRangeSchema>
