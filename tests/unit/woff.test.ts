import { readdirSync, readFileSync } from 'node:fs'
import * as fontkit from 'fontkit'
import { describe, expect, it } from 'vitest'
import { sfntOf } from '../../server/utils/woff'

const dir = new URL('../../server/assets/fonts/', import.meta.url)
const fonts = readdirSync(dir).filter(f => f.endsWith('.woff'))
const SAMPLE = 'Invoice W-12 Coolant sensor 2.4 kΩ at 20 °C ± 5 % Nováček Ørsted ≤ √ μ'

// OpenType spec, "Calculating checksums": the sum of the table's big-endian uint32s, zero-padded.
function tableChecksum(b: Buffer): number {
  let sum = 0
  const padded = Buffer.concat([b, Buffer.alloc((4 - (b.length % 4)) % 4)])
  for (let i = 0; i < padded.length; i += 4) sum = (sum + padded.readUInt32BE(i)) >>> 0
  return sum
}

describe('WOFF to the plain font inside', () => {
  it.each(fonts)('%s: fontkit (the reference reader) sees the same font in both', (file) => {
    const woff = readFileSync(new URL(file, dir))
    const sfnt = sfntOf(woff)
    const a = fontkit.create(woff) as fontkit.Font
    const b = fontkit.create(sfnt) as fontkit.Font
    expect(a.type).toBe('WOFF')
    expect(b.type).toBe('TTF')
    expect(b.postscriptName).toBe(a.postscriptName)
    expect(b.numGlyphs).toBe(a.numGlyphs)
    expect(b.unitsPerEm).toBe(a.unitsPerEm)
    const widths = (f: fontkit.Font) => f.layout(SAMPLE).glyphs.map(g => [g.id, g.advanceWidth])
    expect(widths(b)).toEqual(widths(a))
  })

  it.each(fonts)('%s: each table sits where its directory entry says, with the checksum the spec computes', (file) => {
    const sfnt = sfntOf(readFileSync(new URL(file, dir)))
    const n = sfnt.readUInt16BE(4)
    // OpenType spec, "Table Directory": searchRange = 16 · 2^floor(log2 n), entrySelector, rangeShift.
    expect(sfnt.readUInt16BE(6)).toBe(16 * 2 ** Math.floor(Math.log2(n)))
    expect(sfnt.readUInt16BE(8)).toBe(Math.floor(Math.log2(n)))
    expect(sfnt.readUInt16BE(10)).toBe(n * 16 - sfnt.readUInt16BE(6))
    for (let i = 0; i < n; i++) {
      const at = 12 + i * 16
      const tag = sfnt.toString('latin1', at, at + 4)
      const table = sfnt.subarray(sfnt.readUInt32BE(at + 8), sfnt.readUInt32BE(at + 8) + sfnt.readUInt32BE(at + 12))
      // 'head' holds checkSumAdjustment, which its own checksum leaves out (OpenType spec, 'head' table).
      if (tag !== 'head') expect(tableChecksum(table), tag).toBe(sfnt.readUInt32BE(at + 4))
    }
  })

  it('hands back bytes that are not WOFF as they are', () => {
    const plain = Buffer.from('not a font at all, only some bytes for the check')
    expect(sfntOf(plain)).toBe(plain)
  })
})
