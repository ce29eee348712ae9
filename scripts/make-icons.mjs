// Draws Wayside's app icons (a road running to the horizon with its centre line, on our teal)
// straight into PNG files, so no image tool or download is needed. Run once; outputs are committed.
import { writeFileSync } from 'node:fs'
import { deflateSync } from 'node:zlib'

const TEAL = [14, 59, 67], ROAD = [38, 46, 52], LINE = [240, 190, 80], EDGE = [247, 244, 234]

function crc32(buf) {
  let c, crc = 0xffffffff
  for (let n = 0; n < buf.length; n++) {
    c = (crc ^ buf[n]) & 0xff
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1
    crc = (crc >>> 8) ^ c
  }
  return (crc ^ 0xffffffff) >>> 0
}
function chunk(type, data) {
  const len = Buffer.alloc(4)
  len.writeUInt32BE(data.length)
  const td = Buffer.concat([Buffer.from(type), data])
  const crc = Buffer.alloc(4)
  crc.writeUInt32BE(crc32(td))
  return Buffer.concat([len, td, crc])
}
function png(size, pixel) {
  const raw = Buffer.alloc((size * 4 + 1) * size)
  for (let y = 0; y < size; y++) {
    raw[y * (size * 4 + 1)] = 0
    for (let x = 0; x < size; x++) {
      const [r, g, b, a] = pixel(x / size, y / size)
      const o = y * (size * 4 + 1) + 1 + x * 4
      raw[o] = r
      raw[o + 1] = g
      raw[o + 2] = b
      raw[o + 3] = a
    }
  }
  const ihdr = Buffer.alloc(13)
  ihdr.writeUInt32BE(size, 0)
  ihdr.writeUInt32BE(size, 4)
  ihdr[8] = 8
  ihdr[9] = 6
  return Buffer.concat([
    Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw)),
    chunk('IEND', Buffer.alloc(0)),
  ])
}
function scene(inset) {
  return (u, v) => {
    // Work in the inner square so the maskable icon keeps its drawing inside the safe zone.
    const x = (u - inset) / (1 - 2 * inset), y = (v - inset) / (1 - 2 * inset)
    const horizon = 0.3, t = (y - horizon) / (1 - horizon)
    if (y > horizon && y <= 1.02 && t >= 0) {
      const half = 0.04 + t * 0.42, d = Math.abs(x - 0.5)
      if (d < half) {
        if (d > half - 0.035 - t * 0.02) return [...EDGE, 255]
        const dash = Math.floor(Math.pow(t, 0.55) * 6) % 2 === 0
        if (dash && d < 0.012 + t * 0.03) return [...LINE, 255]
        return [...ROAD, 255]
      }
    }
    // A low sun on the horizon, for the early and late calls.
    const sx = x - 0.5, sy = y - horizon
    if (sy < 0 && sx * sx + sy * sy < 0.028) return [...LINE, 255]
    return [...TEAL, 255]
  }
}
function rounded(draw, radius) {
  return (u, v) => {
    const cx = Math.min(Math.max(u, radius), 1 - radius), cy = Math.min(Math.max(v, radius), 1 - radius)
    if ((u - cx) ** 2 + (v - cy) ** 2 > radius * radius) return [0, 0, 0, 0]
    return draw(u, v)
  }
}
writeFileSync('public/icons/wayside-192.png', png(192, rounded(scene(0.06), 0.18)))
writeFileSync('public/icons/wayside-512.png', png(512, rounded(scene(0.06), 0.18)))
writeFileSync('public/icons/wayside-maskable-512.png', png(512, scene(0.16)))
writeFileSync('public/apple-touch-icon.png', png(180, scene(0.08)))
console.log('icons written')
