// Bytes as a scan tool's raw view shows them, pasted into the phone: hex pairs separated by
// spaces, commas, semicolons or new lines, with or without a 0x prefix ("04 FF 64 00", "0x04,0xFF"),
// or one unbroken run of pairs ("04FF6400"). Anything else is refused naming the piece.

/** The bytes in pasted text; throws a RangeError that names the first piece that is not a byte. */
export function hexBytesFromText(text: string): number[] {
  if (typeof text !== 'string' || !text.trim()) throw new RangeError('Paste the data bytes, two hex digits each (04 FF 64 00 …)')
  const tokens = text.trim().split(/[\s,;]+/).filter(Boolean).map(t => t.replace(/^0x/i, ''))
  const only = tokens.length === 1 ? tokens[0]! : undefined
  // One unbroken run: read two digits per byte.
  if (only !== undefined && only.length > 2) {
    if (!/^[0-9a-f]+$/i.test(only)) throw new RangeError(`"${only}" is not hex: use the digits 0–9 and the letters A–F`)
    if (only.length % 2) throw new RangeError(`"${only}" has an odd number of hex digits: every byte is two`)
    return only.match(/../g)!.map(pair => parseInt(pair, 16))
  }
  return tokens.map((t) => {
    if (!/^[0-9a-f]+$/i.test(t)) throw new RangeError(`"${t}" is not a hex byte: use two of the digits 0–9 and letters A–F`)
    if (t.length > 2) throw new RangeError(`"${t}" is longer than one byte: paste only the data bytes, two hex digits each (04 FF 64 00 …)`)
    return parseInt(t, 16)
  })
}
