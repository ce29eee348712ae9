// Pasted raw bytes, in the ways scan tools print them.
import { describe, expect, it } from 'vitest'
import { hexBytesFromText } from '../../shared/utils/hexBytes'

describe('hexBytesFromText', () => {
  it('reads hex pairs with spaces, commas, new lines and 0x prefixes alike', () => {
    // REFERENCES §4, J1939-73 DM1 layout: SPN 100 FMI 1 OC 1 is 64 00 01 01; lamp byte 04 is the amber lamp on (bits 01)
    const want = [0x04, 0xff, 0x64, 0x00, 0x01, 0x01, 0xff, 0xff]
    expect(hexBytesFromText('04 FF 64 00 01 01 FF FF')).toEqual(want)
    expect(hexBytesFromText('0x04,0xFF,0x64,0x00,0x01,0x01,0xFF,0xFF')).toEqual(want)
    expect(hexBytesFromText('04 ff\n64 00 01 01\tff ff ')).toEqual(want)
    expect(hexBytesFromText('0x04, 0xff; 64 00 01 01 FF FF')).toEqual(want)
    expect(hexBytesFromText('04FF640001 01FFFF'.replace(' ', ''))).toEqual(want)
    expect(hexBytesFromText('4 F')).toEqual([4, 15])
  })

  it('refuses what is not a byte, naming it', () => {
    // Wayside's own contract: the mechanic is told which piece to fix
    expect(() => hexBytesFromText('')).toThrow(/Paste the data bytes/)
    expect(() => hexBytesFromText('04 FG 64')).toThrow(/"FG" is not a hex byte/)
    expect(() => hexBytesFromText('18FECA00 04 FF')).toThrow(/"18FECA00" is longer than one byte/)
    expect(() => hexBytesFromText('04FF6')).toThrow(/odd number/)
    expect(() => hexBytesFromText('04FZ')).toThrow(/not hex/)
  })
})
