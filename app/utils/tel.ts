/** A `tel:` address from a phone number as typed ("(612) 555-0142" → "tel:6125550142"); extensions and words dropped. */
export function telHref(phone: string): string {
  const main = phone.split(/\s*(?:x|ext\.?|#)\s*\d/i)[0] ?? phone
  return `tel:${main.replace(/[^\d+]/g, '')}`
}

/** "Dana" from "Dana Whitfield": what a dispatcher says on the phone. */
export const firstName = (name: string) => name.trim().split(/\s+/)[0] ?? name
