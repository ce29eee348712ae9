// WOFF 1.0 to the plain font file it wraps (W3C WOFF File Format 1.0, section 5: a 44-byte header,
// a 20-byte directory entry per table, each table zlib-compressed when that made it smaller).
// pdfkit re-reads a font for every document it is registered with; from a WOFF that means
// inflating every table again each time, several times slower than reading the plain file.
import { inflateSync } from 'node:zlib'

const WOFF_SIGNATURE = 0x774F4646 // 'wOFF'

/** The sfnt (TrueType/OpenType) bytes inside a WOFF file; bytes that are not WOFF come back as they are. */
export function sfntOf(woff: Buffer): Buffer {
  if (woff.length < 44 || woff.readUInt32BE(0) !== WOFF_SIGNATURE) return woff
  const flavor = woff.readUInt32BE(4)
  const numTables = woff.readUInt16BE(12)
  const tables = Array.from({ length: numTables }, (_, i) => {
    const at = 44 + i * 20
    const offset = woff.readUInt32BE(at + 4)
    const compLength = woff.readUInt32BE(at + 8)
    const origLength = woff.readUInt32BE(at + 12)
    const stored = woff.subarray(offset, offset + compLength)
    const data = compLength < origLength ? inflateSync(stored) : Buffer.from(stored)
    if (data.length !== origLength) throw new Error('A WOFF table did not inflate to its recorded length')
    return { tag: woff.readUInt32BE(at), checksum: woff.readUInt32BE(at + 16), data }
  })
  // The sfnt header's binary-search fields (OpenType spec, "Table Directory").
  const entrySelector = Math.floor(Math.log2(numTables))
  const searchRange = 2 ** entrySelector * 16
  const head = Buffer.alloc(12 + numTables * 16)
  head.writeUInt32BE(flavor, 0)
  head.writeUInt16BE(numTables, 4)
  head.writeUInt16BE(searchRange, 6)
  head.writeUInt16BE(entrySelector, 8)
  head.writeUInt16BE(numTables * 16 - searchRange, 10)
  const parts: Buffer[] = [head]
  let offset = head.length
  tables.forEach((t, i) => {
    const at = 12 + i * 16
    head.writeUInt32BE(t.tag, at)
    head.writeUInt32BE(t.checksum, at + 4)
    head.writeUInt32BE(offset, at + 8)
    head.writeUInt32BE(t.data.length, at + 12)
    const pad = (4 - (t.data.length % 4)) % 4
    parts.push(t.data, Buffer.alloc(pad))
    offset += t.data.length + pad
  })
  return Buffer.concat(parts)
}
