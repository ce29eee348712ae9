// The one text schema every payload and query string uses. PostgreSQL cannot store a NUL, and no
// person types a control character on purpose; such text answers 400 naming the field before
// anything is written. Multi-line boxes (notes, complaint, story) may hold tabs and line breaks.
import { z } from 'zod'

// C0 controls, DEL, C1 controls, and a UTF-16 half (a lone surrogate) that no character makes.
/* eslint-disable no-control-regex -- matching control characters is the point */
const SINGLE_LINE = /^[^\u0000-\u001F\u007F-\u009F\p{Cs}]*$/u
const MULTI_LINE = /^[^\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F-\u009F\p{Cs}]*$/u
/* eslint-enable no-control-regex */

export type TextOptions = {
  /** Tabs and line breaks allowed (a note, not a name). */
  multiline?: boolean
  /** The message when the field is left out or empty (required text only). */
  missing?: string
}

/** Whether text holds a character no text field accepts (for code outside zod). */
export function hasControlCharacter(text: string, opts: TextOptions = {}): boolean {
  return !(opts.multiline ? MULTI_LINE : SINGLE_LINE).test(text)
}

/** Trimmed text without control characters; chain `.min`/`.max` as needed. */
export function cleanText(label: string, opts: TextOptions = {}) {
  const allowed = opts.multiline ? MULTI_LINE : SINGLE_LINE
  const what = opts.multiline ? 'an invisible control character (such as NUL)' : 'a tab, line break or invisible control character'
  const notText = `${label} must be text`
  return z.string({ error: iss => (iss.input === undefined && opts.missing) || notText })
    .trim().regex(allowed, `${label} contains ${what}; type it again without it`)
}

/** Text that must be given, at most `max` characters. `missing` is the message for an empty box. */
export function requiredText(max: number, what: string, opts: TextOptions = {}) {
  return cleanText(what, opts)
    .min(1, opts.missing ?? `Enter ${what.toLowerCase()}`)
    .max(max, `${what} is too long (at most ${max} characters)`)
}

/** Optional text; '' and spaces become null, and undefined stays undefined so a PATCH leaves it alone. */
export function text(max: number, label = 'This', opts: TextOptions = {}) {
  return cleanText(label, opts).max(max, `${label} is too long (at most ${max} characters)`)
    .nullable().optional().transform(v => (v === '' ? null : v))
}

/** A search box in a query string (`?q=`): at most 100 characters; empty means no search. */
export const searchQuery = cleanText('Search').max(100, 'Search is too long (at most 100 characters)')
  .optional().transform(v => (v ? v : undefined))
