import type { z } from 'zod'

/** Zod issues as `{ 'unit.vin': 'VIN must be 17 characters' }`, for forms and 400 answers alike. */
export function fieldErrorsOf(error: z.ZodError): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of error.issues) {
    const key = issue.path.map(String).join('.') || '_'
    if (!(key in out)) out[key] = issue.message
  }
  return out
}

/** One line naming each bad field, for messages and logs. */
export function describeFieldErrors(fields: Record<string, string>): string {
  return Object.entries(fields).map(([k, v]) => (k === '_' ? v : `${k}: ${v}`)).join('; ')
}
