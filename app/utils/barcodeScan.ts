// Reading a barcode from the camera: the browser's own BarcodeDetector where it reads the formats
// asked for, otherwise ZXing (@zxing/browser), loaded only when someone taps "Scan" so the phone's
// first load does not carry it.

/** Format names as the BarcodeDetector spells them; ZXing's are mapped below. */
export type ScanFormat = 'code_39' | 'code_128' | 'data_matrix' | 'qr_code' | 'ean_13' | 'upc_a'

export type ScanProblem = 'unsupported' | 'refused' | 'no_camera' | 'busy' | 'failed'

/** Why the camera could not be used, in words a person acts on; typing always stays possible. */
export const SCAN_PROBLEM_WORDS: Record<ScanProblem, string> = {
  unsupported: 'This browser cannot use a camera here. Type it in instead.',
  refused: 'The camera was not allowed. Type it in instead, or allow the camera for Wayside in the browser’s settings and try again.',
  no_camera: 'No camera was found on this device. Type it in instead.',
  busy: 'The camera is in use by another app or could not start. Close that app, or type it in instead.',
  failed: 'The barcode reader could not start. Type it in instead.',
}

export class ScanError extends Error {
  constructor(readonly problem: ScanProblem) {
    super(SCAN_PROBLEM_WORDS[problem])
  }
}

/** What a camera error means for the person: refused, none there, or in use. */
export function scanProblemOf(err: unknown): ScanProblem {
  if (err instanceof ScanError) return err.problem
  const name = (err as { name?: string } | null)?.name
  if (name === 'NotAllowedError' || name === 'SecurityError' || name === 'PermissionDeniedError') return 'refused'
  if (name === 'NotFoundError' || name === 'OverconstrainedError' || name === 'DevicesNotFoundError') return 'no_camera'
  if (name === 'NotReadableError' || name === 'AbortError' || name === 'TrackStartError') return 'busy'
  return 'failed'
}

export interface Scan {
  /** 'native' (BarcodeDetector) or 'zxing': which reader is working, for the person's status line. */
  reader: 'native' | 'zxing'
  stop: () => void
}

type Detector = { detect: (source: CanvasImageSource) => Promise<{ rawValue: string }[]> }
type DetectorClass = {
  new (opts: { formats: string[] }): Detector
  getSupportedFormats: () => Promise<string[]>
}

/** A frame reader: the text of a barcode seen in the video now, or null. */
type FrameReader = (video: HTMLVideoElement) => Promise<string | null>

async function nativeReader(formats: ScanFormat[]): Promise<FrameReader | null> {
  const BarcodeDetector = (globalThis as { BarcodeDetector?: DetectorClass }).BarcodeDetector
  if (!BarcodeDetector) return null
  const supported = await BarcodeDetector.getSupportedFormats().catch(() => [] as string[])
  if (!formats.every(f => supported.includes(f))) return null
  const detector = new BarcodeDetector({ formats })
  return async (video) => {
    const found = await detector.detect(video)
    return found[0]?.rawValue ?? null
  }
}

async function zxingReader(formats: ScanFormat[]): Promise<FrameReader> {
  const [{ BrowserMultiFormatReader }, { BarcodeFormat, DecodeHintType, NotFoundException, ChecksumException, FormatException }]
    = await Promise.all([import('@zxing/browser'), import('@zxing/library')])
  const ZXING: Record<ScanFormat, number> = {
    code_39: BarcodeFormat.CODE_39,
    code_128: BarcodeFormat.CODE_128,
    data_matrix: BarcodeFormat.DATA_MATRIX,
    qr_code: BarcodeFormat.QR_CODE,
    ean_13: BarcodeFormat.EAN_13,
    upc_a: BarcodeFormat.UPC_A,
  }
  const hints = new Map<number, unknown>([
    [DecodeHintType.POSSIBLE_FORMATS, formats.map(f => ZXING[f])],
    [DecodeHintType.TRY_HARDER, true],
  ])
  const reader = new BrowserMultiFormatReader(hints)
  const canvas = document.createElement('canvas')
  const ctx = canvas.getContext('2d', { willReadFrequently: true })
  if (!ctx) throw new ScanError('failed')
  return async (video) => {
    if (!video.videoWidth) return null
    // A phone camera's full frame is slow to search; a 1280 px wide copy reads a label just as well.
    const scale = Math.min(1, 1280 / video.videoWidth)
    canvas.width = Math.round(video.videoWidth * scale)
    canvas.height = Math.round(video.videoHeight * scale)
    ctx.drawImage(video, 0, 0, canvas.width, canvas.height)
    try {
      return reader.decodeFromCanvas(canvas).getText()
    }
    catch (err) {
      // Nothing readable in this frame: the usual case until the label is in view.
      if (err instanceof NotFoundException || err instanceof ChecksumException || err instanceof FormatException) return null
      throw err
    }
  }
}

/**
 * Shows the back camera in `video` and reads barcodes of `formats` until `onText` answers true
 * (the text was taken) or `stop()` is called. Throws ScanError when the camera cannot be used.
 */
export async function startScan(video: HTMLVideoElement, formats: ScanFormat[], onText: (text: string) => boolean): Promise<Scan> {
  if (!navigator.mediaDevices?.getUserMedia) throw new ScanError('unsupported')
  let stream: MediaStream
  try {
    stream = await navigator.mediaDevices.getUserMedia({
      audio: false,
      video: { facingMode: { ideal: 'environment' }, width: { ideal: 1280 }, height: { ideal: 720 } },
    })
  }
  catch (err) {
    throw new ScanError(scanProblemOf(err))
  }
  let stopped = false
  let timer: ReturnType<typeof setTimeout> | undefined
  const stop = () => {
    stopped = true
    clearTimeout(timer)
    stream.getTracks().forEach(t => t.stop())
    video.srcObject = null
  }
  try {
    video.srcObject = stream
    video.muted = true
    video.setAttribute('playsinline', '')
    await video.play()
    const native = await nativeReader(formats)
    const read = native ?? await zxingReader(formats)
    const tick = async () => {
      if (stopped) return
      const text = await read(video).catch(() => null)
      if (stopped) return
      if (text && onText(text)) stop()
      else timer = setTimeout(tick, 150)
    }
    timer = setTimeout(tick, 0)
    return { reader: native ? 'native' : 'zxing', stop }
  }
  catch (err) {
    stop()
    throw err instanceof ScanError ? err : new ScanError('failed')
  }
}
