import { describe, expect, it } from 'vitest'
import { cleanText, hasControlCharacter, requiredText, searchQuery, text } from '../../shared/schemas/text'

// The Unicode Standard, General Category Cc (control): U+0000–U+001F and U+007F–U+009F.
const C0 = Array.from({ length: 0x20 }, (_, i) => String.fromCharCode(i))
const C1 = Array.from({ length: 0x21 }, (_, i) => String.fromCharCode(0x7f + i))

describe('the shared text schema', () => {
  it('refuses every control character (Unicode category Cc) in a single-line field', () => {
    for (const ch of [...C0, ...C1]) {
      const r = requiredText(100, 'Name').safeParse(`ab${ch}cd`)
      expect(r.success, `U+${ch.charCodeAt(0).toString(16).padStart(4, '0')}`).toBe(false)
    }
  })

  it('takes tab, line feed and carriage return in a multi-line field, and no other control character', () => {
    const multi = requiredText(100, 'Note', { multiline: true })
    expect(multi.safeParse('first line\r\n\tsecond line').success).toBe(true)
    for (const ch of [...C0, ...C1].filter(c => !'\t\n\r'.includes(c))) expect(multi.safeParse(`a${ch}b`).success).toBe(false)
  })

  it('refuses a lone UTF-16 surrogate (no character), takes a real astral character', () => {
    expect(hasControlCharacter('unit \uD83D here')).toBe(true)
    expect(hasControlCharacter('unit \uD83D\uDE9A here')).toBe(false) // U+1F69A DELIVERY TRUCK
  })

  it('keeps ordinary text from the trade: accents, degree signs, ohms, dashes', () => {
    for (const s of ['Sensor 2 — 118 Ω at 12 °C', 'Côte-Saint-Luc yard', 'PO #4471/B', '½" line']) {
      expect(requiredText(100, 'Label').parse(s)).toBe(s)
    }
  })

  it('names the field in its message and trims around the text', () => {
    const r = requiredText(20, 'Location', { missing: 'Say where the truck is' })
    expect(r.safeParse(undefined).error?.issues[0]?.message).toBe('Say where the truck is')
    expect(r.safeParse('   ').error?.issues[0]?.message).toBe('Say where the truck is')
    expect(r.safeParse('a\u0000').error?.issues[0]?.message).toMatch(/^Location contains/)
    expect(r.safeParse('x'.repeat(21)).error?.issues[0]?.message).toMatch(/at most 20/)
    expect(r.parse('  Route 8  ')).toBe('Route 8')
  })

  it('optional text: empty becomes null, left out stays undefined', () => {
    expect(text(10, 'Notes').parse('  ')).toBeNull()
    expect(text(10, 'Notes').parse(undefined)).toBeUndefined()
    expect(cleanText('Phone').max(5).safeParse('123456').success).toBe(false)
  })

  it('a search: empty means no search; control characters and overlong text are refused', () => {
    expect(searchQuery.parse('')).toBeUndefined()
    expect(searchQuery.parse(' brake ')).toBe('brake')
    expect(searchQuery.safeParse('brake\u0000').success).toBe(false)
    expect(searchQuery.safeParse('x'.repeat(101)).success).toBe(false)
  })
})
