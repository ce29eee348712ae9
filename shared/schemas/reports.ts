import { z } from 'zod'
import { isoDay } from './dates'

export const REPORT_NAMES = ['calls-per-day', 'response-times', 'fix-rate', 'mechanic-weeks', 'comebacks', 'revenue', 'parts'] as const
export type ReportName = (typeof REPORT_NAMES)[number]

export const reportParamsSchema = z.object({
  name: z.enum(REPORT_NAMES, { message: `Name a report: ${REPORT_NAMES.join(', ')}` }),
})

/** `?from=&to=` (inclusive ISO dates); the last 30 days when left out. */
export const reportRangeSchema = z.object({
  from: isoDay('From').optional(),
  to: isoDay('To').optional(),
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
