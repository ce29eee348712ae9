import type { z } from 'zod'

export interface FieldErrorOptions {
  /** The message for a key a strict schema does not know (default: "Not a field this takes"). */
  unknownKey?: (key: string) => string
  /** The name for an issue about the whole value (default `_`, which describeFieldErrors prints bare). */
  root?: string
}

/**
 * Zod issues as `{ 'unit.vin': 'VIN must be 17 characters' }`: the one formatter for forms, 400
 * answers and sync reasons alike (the first message per field wins).
 */
export function fieldErrorsOf(error: z.ZodError, opts: FieldErrorOptions = {}): Record<string, string> {
  const out: Record<string, string> = {}
  for (const issue of error.issues) {
    const at = issue.path.map(String).join('.')
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        const k = at ? `${at}.${key}` : key
        if (!(k in out)) out[k] = opts.unknownKey?.(key) ?? 'Not a field this takes'
      }
      continue
    }
    const key = at || opts.root || '_'
    if (!(key in out)) out[key] = issue.message
  }
  return out
}

/** One line naming each bad field, for messages, logs and sync reasons. */
export function describeFieldErrors(fields: Record<string, string>): string {
  return Object.entries(fields).map(([k, v]) => (k === '_' ? v : `${k}: ${v}`)).join('; ')
}

/** fieldErrorsOf and describeFieldErrors in one: "value: Expected a number; kind: Unknown kind". */
export function describeIssues(error: z.ZodError, opts: FieldErrorOptions = {}): string {
  return describeFieldErrors(fieldErrorsOf(error, opts))
}
