// Compression of answers (server/plugins/compression.ts): which encoding a client takes, which
// bodies are worth it, and the compressing itself, off the event loop (zlib's thread pool).
import { promisify } from 'node:util'
import { brotliCompress, constants, gzip } from 'node:zlib'

export type Encoding = 'br' | 'gzip'

/** Below this many bytes the headers cost about what compression would save. */
export const COMPRESS_MIN_BYTES = 1024

const brotli = promisify(brotliCompress)
const gz = promisify(gzip)

/** The encoding to use from an Accept-Encoding header: brotli, else gzip, else none (q=0 refuses one). */
export function pickEncoding(header: string | undefined): Encoding | undefined {
  const taken = new Map<string, number>()
  for (const part of (header ?? '').toLowerCase().split(',')) {
    const [name, ...params] = part.trim().split(';')
    if (!name) continue
    const q = params.map(p => p.trim()).find(p => p.startsWith('q='))
    taken.set(name.trim(), q ? Number(q.slice(2)) || 0 : 1)
  }
  const ok = (name: Encoding) => (taken.get(name) ?? (taken.has('*') ? taken.get('*')! : 0)) > 0
  if (ok('br')) return 'br'
  if (ok('gzip')) return 'gzip'
  return undefined
}

const TEXT_TYPE = /^(text\/|application\/(json|javascript|xml|manifest\+json)|image\/svg\+xml)/i

/**
 * The text a route answered, with its content type, when it is worth compressing: an object h3
 * would send as JSON, or a string the route marked as text. Bytes, streams and small bodies are
 * left alone (photos are compressed already).
 */
export function bodyText(body: unknown, contentType: string): { body: string, type: string } | undefined {
  let text: string
  let type = contentType
  if (typeof body === 'string') {
    if (!TEXT_TYPE.test(contentType || 'text/html')) return undefined
    text = body
    type ||= 'text/html; charset=utf-8'
  }
  else if (body !== null && typeof body === 'object' && isPlainJson(body)) {
    text = JSON.stringify(body)
    type = contentType && /json/i.test(contentType) ? contentType : 'application/json; charset=utf-8'
  }
  else return undefined
  // Length in UTF-16 units is at most the byte length, so a short string is small in bytes too.
  if (text.length < COMPRESS_MIN_BYTES && Buffer.byteLength(text) < COMPRESS_MIN_BYTES) return undefined
  return { body: text, type }
}

function isPlainJson(body: object) {
  if (Array.isArray(body)) return true
  const proto = Object.getPrototypeOf(body)
  return proto === Object.prototype || proto === null
}

/** The text compressed, or undefined when it did not get smaller. Brotli at a level quick enough for each answer. */
export async function compressText(text: string, encoding: Encoding): Promise<Buffer | undefined> {
  const raw = Buffer.from(text)
  const params = {
    [constants.BROTLI_PARAM_QUALITY]: 5,
    [constants.BROTLI_PARAM_MODE]: constants.BROTLI_MODE_TEXT,
    [constants.BROTLI_PARAM_SIZE_HINT]: raw.length,
  }
  const packed = encoding === 'br' ? await brotli(raw, { params }) : await gz(raw, { level: 6 })
  return packed.length < raw.length ? packed : undefined
}
