// Whether a new password is too easy to guess, and why in words a person can act on. The length
// rule comes first; then zxcvbn (@zxcvbn-ts/core) scores it against the common-password list of
// @zxcvbn-ts/language-common, keyboard patterns, repeats, dates, and words tied to this business
// or this person. Score 3 of 4 ("safely unguessable") is the bar, as zxcvbn's authors advise.
import { ZxcvbnFactory } from '@zxcvbn-ts/core'
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common'

export const PASSWORD_MIN_LENGTH = 10
export const PASSWORD_MAX_LENGTH = 200
const MIN_SCORE = 3

/** Words anyone would try first against this business. */
const BUSINESS_WORDS = [
  'wayside', 'demo', 'road', 'call', 'roadcall', 'mechanic', 'dispatch', 'dispatcher', 'office', 'admin', 'truck', 'fleet', 'service',
]

const REASONS: Record<string, string> = {
  straightRow: 'keys in a row on the keyboard are easy to guess',
  keyPattern: 'a pattern on the keyboard is easy to guess',
  simpleRepeat: 'repeated characters are easy to guess',
  extendedRepeat: 'a repeated group of characters is easy to guess',
  sequences: 'a run like abc or 6543 is easy to guess',
  recentYears: 'a recent year is easy to guess',
  dates: 'a date is easy to guess',
  topTen: 'it is one of the ten most used passwords',
  topHundred: 'it is one of the hundred most used passwords',
  common: 'it is a commonly used password',
  similarToCommon: 'it is close to a commonly used password',
  wordByItself: 'a single word is easy to guess',
  namesByThemselves: 'a name on its own is easy to guess',
  commonNames: 'common names are easy to guess',
  userInputs: 'it is built from words tied to Wayside or to this person (such as "wayside", a name or the e-mail)',
  pwned: 'it has appeared in leaked password lists',
}

let factory: ZxcvbnFactory | undefined
// Built on first use: reading the dictionaries takes a moment, and most requests never need them.
function zxcvbn() {
  factory ??= new ZxcvbnFactory({ dictionary: { ...dictionary, userInputs: BUSINESS_WORDS }, graphs: adjacencyGraphs })
  return factory
}

/**
 * Why this password will not do, or null when it will. `related` are the person's own details
 * (name, e-mail), which a guesser would try too.
 */
export function passwordProblem(password: string, related: (string | null | undefined)[] = []): string | null {
  if (password.length < PASSWORD_MIN_LENGTH) return `Use at least ${PASSWORD_MIN_LENGTH} characters`
  if (password.length > PASSWORD_MAX_LENGTH) return `Use at most ${PASSWORD_MAX_LENGTH} characters`
  const inputs = related.filter((r): r is string => !!r).flatMap(r => [r, ...r.toLowerCase().split(/[^a-z0-9]+/)]).filter(r => r.length >= 3)
  const result = zxcvbn().check(password, inputs)
  if (result.score >= MIN_SCORE) return null
  const reason = (result.feedback.warning && REASONS[result.feedback.warning]) || 'it is too easy to guess'
  return `Too easy to guess: ${reason}. Try three or four unrelated words.`
}
