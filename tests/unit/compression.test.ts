import { brotliDecompressSync, gunzipSync } from 'node:zlib'
import { describe, expect, it } from 'vitest'
import { bodyText, COMPRESS_MIN_BYTES, compressText, pickEncoding } from '../../server/utils/compression'

describe('which encoding a client takes', () => {
  // RFC 9110 §12.5.3: a coding with q=0 is not acceptable; "*" stands for any coding not named.
  it.each([
    ['gzip, deflate, br', 'br'],
    ['gzip, deflate', 'gzip'],
    ['br;q=0, gzip;q=0.5', 'gzip'],
    ['br;q=0, gzip;q=0', undefined],
    ['identity', undefined],
    ['*', 'br'],
    ['*;q=0', undefined],
    ['GZIP', 'gzip'],
    ['', undefined],
    [undefined, undefined],
  ])('%s → %s', (header, want) => {
    expect(pickEncoding(header)).toBe(want)
  })
})

describe('which answers are worth compressing', () => {
  const big = { items: Array.from({ length: 60 }, (_, i) => ({ id: i, note: 'secured the scene, read the codes' })) }

  it('takes a JSON object or array h3 would send, as JSON', () => {
    expect(bodyText(big, '')).toEqual({ body: JSON.stringify(big), type: 'application/json; charset=utf-8' })
    expect(bodyText(big.items, 'application/json')?.type).toBe('application/json')
  })

  it('takes an HTML page, keeping its type', () => {
    const page = `<!doctype html><p>${'Road call '.repeat(200)}</p>`
    expect(bodyText(page, 'text/html;charset=utf-8')?.type).toBe('text/html;charset=utf-8')
  })

  it('leaves small answers, bytes and binary types alone', () => {
    expect(bodyText({ ok: true }, '')).toBeUndefined()
    expect(bodyText('x'.repeat(COMPRESS_MIN_BYTES - 1), 'text/html')).toBeUndefined()
    expect(bodyText(Buffer.alloc(5000), 'image/jpeg')).toBeUndefined()
    expect(bodyText('x'.repeat(5000), 'image/jpeg')).toBeUndefined()
    expect(bodyText(new Date(), '')).toBeUndefined()
  })
})

describe('the compressing', () => {
  const readings = Array.from({ length: 500 }, (_, i) => ({ id: `r-${i}`, value: i * 0.5, unit: 'Ω', label: 'Sensor 2' }))
  const text = JSON.stringify({ readings })

  // The reference: node:zlib's own decoders (RFC 7932 brotli, RFC 1952 gzip) give back the same bytes.
  it('brotli and gzip both decode to the same text, and are much smaller', async () => {
    const br = (await compressText(text, 'br'))!
    const gz = (await compressText(text, 'gzip'))!
    expect(brotliDecompressSync(br).toString()).toBe(text)
    expect(gunzipSync(gz).toString()).toBe(text)
    expect(br.length).toBeLessThan(text.length / 5)
    expect(gz.length).toBeLessThan(text.length / 4)
  })

  it('gives nothing when compressing would not make it smaller', async () => {
    // RFC 1952: a gzip member alone has 18 bytes of header and trailer.
    expect(await compressText('ok', 'gzip')).toBeUndefined()
    expect(await compressText('ok', 'br')).toBeUndefined()
  })
})
