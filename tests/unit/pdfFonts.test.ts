import { readFileSync } from 'node:fs'
import * as fontkit from 'fontkit'
import { describe, expect, it } from 'vitest'
import { fontRuns, PDF_FACES, type Face } from '../../server/utils/pdfFonts'

const dir = new URL('../../server/assets/fonts/', import.meta.url)
const pkg = (p: string) => new URL(`../../node_modules/@fontsource/${p}`, import.meta.url)
const face = (name: string): Face => {
  const font = fontkit.create(readFileSync(new URL(`${name}.woff`, dir))) as fontkit.Font
  return { name, has: cp => font.hasGlyphForCodePoint(cp) }
}

// What a service record can hold: units as the phone prints them (shared/utils/units.ts), readings
// against spec, accented names of people and places, and the punctuation our own text uses.
const RECORD_TEXT = 'Ω kΩ MΩ °C °F ± µs μ ≤ ≥ ≈ √ → ← × ÷ ½ ² ³ – — · … ’ “ ” € Łukasz Nováček Øster Müller Gómez Đorđe Şahin Chloé Ørsted'

describe('the PDF\'s fonts', () => {
  it('are the @fontsource files, byte for byte (nothing fetched, nothing edited)', () => {
    const same: [string, string][] = [
      ['atkinson-400', 'atkinson-hyperlegible/files/atkinson-hyperlegible-latin-400-normal.woff'],
      ['atkinson-700', 'atkinson-hyperlegible/files/atkinson-hyperlegible-latin-700-normal.woff'],
      ['atkinson-ext-400', 'atkinson-hyperlegible/files/atkinson-hyperlegible-latin-ext-400-normal.woff'],
      ['atkinson-ext-700', 'atkinson-hyperlegible/files/atkinson-hyperlegible-latin-ext-700-normal.woff'],
      ['noto-greek-400', 'noto-sans/files/noto-sans-greek-400-normal.woff'],
      ['noto-greek-700', 'noto-sans/files/noto-sans-greek-700-normal.woff'],
      ['noto-math-400', 'noto-sans-math/files/noto-sans-math-latin-400-normal.woff'],
    ]
    for (const [name, file] of same) expect(readFileSync(new URL(`${name}.woff`, dir)).equals(readFileSync(pkg(file))), name).toBe(true)
  })

  it('Atkinson Hyperlegible alone lacks Ω (the empty box the fleets saw)', () => {
    expect(face('atkinson-400').has('Ω'.codePointAt(0)!)).toBe(false)
  })

  for (const style of ['body', 'bold'] as const) {
    it(`set every character a record holds in a face that has it (${style})`, () => {
      const chain = PDF_FACES[style].map(face)
      const runs = fontRuns(RECORD_TEXT, chain)
      expect(runs.map(r => r.text).join('')).toBe(RECORD_TEXT)
      for (const r of runs) {
        const f = chain.find(c => c.name === r.face)!
        for (const ch of r.text) if (!/\s/.test(ch)) expect(f.has(ch.codePointAt(0)!), `${ch} in ${r.face}`).toBe(true)
      }
      // Plain text stays in Atkinson Hyperlegible, our look.
      expect(fontRuns('Replaced 30 A fuse at 84 °C ± 2', chain).map(r => r.face)).toEqual([PDF_FACES[style][0]])
    })
  }
})
