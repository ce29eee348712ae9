import jsQR from 'jsqr'
import QRCode from 'qrcode'
import { describe, expect, it } from 'vitest'

// The QR code the mechanic shows is drawn by `qrcode` with the settings PaymentQr.vue uses; an
// independent decoder (jsQR, a separate implementation of ISO/IEC 18004) must read the link back.
function rgbaOf(text: string, scale = 4, margin = 4) {
  const qr = QRCode.create(text, { errorCorrectionLevel: 'M' })
  const n = qr.modules.size
  const side = (n + 2 * margin) * scale
  const px = new Uint8ClampedArray(side * side * 4).fill(255)
  for (let y = 0; y < n; y++) {
    for (let x = 0; x < n; x++) {
      if (!qr.modules.get(x, y)) continue
      for (let dy = 0; dy < scale; dy++) {
        for (let dx = 0; dx < scale; dx++) {
          const i = (((y + margin) * scale + dy) * side + (x + margin) * scale + dx) * 4
          px[i] = px[i + 1] = px[i + 2] = 0
        }
      }
    }
  }
  return { px, side }
}

describe('the payment link as a QR code', () => {
  it('reads back exactly, for a link as long as the ones Wayside makes', () => {
    const url = 'https://pay.tworivers-road.example/pay/Zk3v9Qm1_xY-2bL8rT0pWc4HnA6sDeFg'
    const { px, side } = rgbaOf(url)
    expect(jsQR(px, side, side)?.data).toBe(url)
  })
})
