// Free text a mechanic wrote may hold a phone number or an e-mail address (the driver's, a parts
// counter's). What Wayside shows people outside the business passes through here first.

/** Replaced text reads as this. */
export const REDACTED = '[removed]'

const EMAIL = /[\w.+-]+@[\w-]+(?:\.[\w-]+)+/g
// A phone number as people write one: optional country code and area code, then 3 and 4 digits joined
// by a space, dot or dash. Part numbers and readings are one run of digits or carry units.
const PHONE = /(?:\+\d{1,3}[\s.-]?)?(?:\(\d{2,4}\)\s?|\b\d{2,4}[\s.-])?\b\d{3}[\s.-]\d{4}\b/g

/** The text with e-mail addresses and phone numbers replaced by `[removed]`. */
export function redactContact(text: string): string
export function redactContact(text: string | null | undefined): string | null
export function redactContact(text: string | null | undefined): string | null {
  if (text == null) return null
  return text.replace(EMAIL, REDACTED).replace(PHONE, REDACTED)
}
