import { createHash } from 'node:crypto'

/** A stable UUID for a seed record's name, so seeding twice finds the same rows. */
export function seedId(name: string): string {
  const h = createHash('sha1').update(`wayside-seed:${name}`).digest('hex')
  // Shape it as a version-5 UUID (RFC 9562 layout) so validators accept it.
  const variant = ((parseInt(h.slice(16, 18), 16) & 0x3f) | 0x80).toString(16)
  return `${h.slice(0, 8)}-${h.slice(8, 12)}-5${h.slice(13, 16)}-${variant}${h.slice(18, 20)}-${h.slice(20, 32)}`
}
