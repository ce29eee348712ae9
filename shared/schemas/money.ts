import { z } from 'zod'

// The one schema for an amount of money in a payload: integer cents within a range. The range is
// checked before "whole cents", so 1e20 typed by a slip says it is too large (a number that big
// is no longer a safe integer, and zod's integer check would otherwise speak first).

export type CentsOptions = {
  /** Largest amount accepted, in cents (1,000,000.00 by default). */
  max?: number
  /** Zero refused (a payment, a refund), or allowed (a price, a limit). */
  positive?: boolean
  /** What a non-number is called in the message: "an amount" or "a number of cents". */
  kind?: string
}

const dollars = (cents: number) => `$${(cents / 100).toLocaleString('en-US', { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`

/** Whole cents from 0 (or 1 when `positive`) to `max`; each message names the field. */
export function centsSchema(label: string, { max = 100_000_000, positive = false, kind = 'an amount' }: CentsOptions = {}) {
  const tooLarge = `${label} is too large (at most ${dollars(max)})`
  return z.number({ message: `${label} must be ${kind}` })
    .max(max, { message: tooLarge, abort: true })
    // Not aborting here: a form's own cross-field rules (a customer picked) must still speak beside it.
    .min(positive ? 1 : 0, { message: positive ? `${label} must be more than zero` : `${label} cannot be negative` })
    .int(`${label} must be whole cents`)
}
