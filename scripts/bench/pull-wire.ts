// The bytes a phone receives for its first pull on the scale seed, with gzip and brotli accepted as
// the phone's browser accepts them (node:http, so the count is the compressed body as sent), and
// the same without compression for comparison. Target: at most 300 KB.
import { randomUUID } from 'node:crypto'
import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { recordRow } from './support/rows'
import { signIn, wireBytes } from './support/scale'

async function pullBytes(cookie: string, encoding: string) {
  const clientId = randomUUID()
  let cursor: string | undefined
  let bytes = 0
  let pages = 0
  const used = new Set<string>()
  do {
    const q = new URLSearchParams({ clientId, ...(cursor ? { cursor } : {}) })
    const r = await wireBytes(`/api/sync/pull?${q}`, cookie, encoding)
    bytes += r.bytes
    pages++
    used.add(r.encoding)
    const text = r.encoding === 'br' ? brotliDecompressSync(r.body) : r.encoding === 'gzip' ? gunzipSync(r.body) : r.body
    const page = JSON.parse(text.toString('utf8')) as { cursor: string, more: boolean }
    cursor = page.more ? page.cursor : undefined
  } while (cursor)
  return { bytes, pages, encodings: [...used].join('+') }
}

const cookie = await signIn('mech1@wayside.test')
const packed = await pullBytes(cookie, 'gzip, deflate, br')
const plain = await pullBytes(cookie, 'identity')
const kb = (b: number) => b / 1024
console.log(`  first pull: ${kb(packed.bytes).toFixed(1)} KB as sent (${packed.encodings}), ${kb(plain.bytes).toFixed(1)} KB uncompressed, `
  + `${packed.pages} pages`)
recordRow({
  name: 'pull-wire', value: kb(packed.bytes), unit: 'KB', floor: null, target: '≤ 300',
  note: `mech1's first pull on the scale seed, ${packed.pages} pages, ${packed.encodings}; ${kb(plain.bytes).toFixed(0)} KB uncompressed`,
})
