// The PDF's type: Atkinson Hyperlegible for our look, and, for the characters it lacks (Ω, μ, ≤, √,
// Greek), Noto Sans and Noto Sans Math from the same @fontsource packages, all bundled in
// server/assets/fonts. pdfkit has no font fallback, so text is cut into runs, each set in the first
// face of the chain that has every one of its characters.
import * as fontkit from 'fontkit'
import { sfntOf } from './woff'

export type Face = { name: string, has: (codePoint: number) => boolean }

/** Splits text into runs of one face each; a character no face has stays with its neighbours' face. */
export function fontRuns(text: string, chain: readonly Face[]): { face: string, text: string }[] {
  const runs: { face: string, text: string }[] = []
  for (const ch of text) {
    const cp = ch.codePointAt(0)!
    const isSpace = /\s/.test(ch)
    const face = isSpace && runs.length ? runs.at(-1)!.face : (chain.find(f => f.has(cp)) ?? chain[0]!).name
    const last = runs.at(-1)
    if (last && last.face === face) last.text += ch
    else runs.push({ face, text: ch })
  }
  return runs
}

export const PDF_FACES = {
  body: ['atkinson-400', 'atkinson-ext-400', 'noto-greek-400', 'noto-math-400'],
  bold: ['atkinson-700', 'atkinson-ext-700', 'noto-greek-700', 'noto-math-400'],
} as const
export type FaceName = (typeof PDF_FACES)['body' | 'bold'][number]

/** A bundled face: its parsed font, shared by every document of the process (each makes its own subset), and its fallback test. */
export type LoadedFont = { font: fontkit.Font, face: Face }

/** The bundled font files, read and parsed once per process from Nitro's server assets. */
let loaded: Promise<Map<string, LoadedFont>> | null = null
export function pdfFonts() {
  loaded ??= (async () => {
    const names = [...new Set([...PDF_FACES.body, ...PDF_FACES.bold])]
    const out = new Map<string, LoadedFont>()
    for (const name of names) {
      const raw = await useStorage('assets:server').getItemRaw(`fonts/${name}.woff`)
      if (!raw) throw new Error(`The bundled font ${name}.woff is missing from server/assets/fonts`)
      // The plain font inside, parsed here once: given bytes, pdfkit would parse them again for every document.
      const font = fontkit.create(sfntOf(Buffer.from(raw as Uint8Array))) as fontkit.Font
      out.set(name, { font: withShapingCache(font), face: { name, has: cp => font.hasGlyphForCodePoint(cp) } })
    }
    return out
  })().catch((err) => {
    loaded = null
    throw err
  })
  return loaded
}

/** Words shaped per face and kept for the process; past this many the cache starts again. */
const SHAPED_WORDS_MAX = 20_000

type Position = { xAdvance: number, yAdvance: number, xOffset: number, yOffset: number }

/**
 * The font with its text shaping (fontkit's layout, the costliest part of a document) kept per
 * word for the process: invoices repeat the same words. pdfkit scales the positions it is given in
 * place, so each call answers fresh positions beside the shared glyphs.
 */
function withShapingCache(font: fontkit.Font): fontkit.Font {
  const shaped = new Map<string, { glyphs: fontkit.Glyph[], positions: Position[] }>()
  const cached = Object.create(font) as fontkit.Font
  cached.layout = ((text: string, features?: unknown) => {
    const key = features ? `${JSON.stringify(features)}\u0000${text}` : text
    let run = shaped.get(key)
    if (!run) {
      const r = font.layout(text, features as string[])
      const positions = r.positions.map(p => ({ xAdvance: p.xAdvance, yAdvance: p.yAdvance, xOffset: p.xOffset, yOffset: p.yOffset }))
      run = { glyphs: r.glyphs, positions }
      if (shaped.size >= SHAPED_WORDS_MAX) shaped.clear()
      shaped.set(key, run)
    }
    const positions = run.positions.map(p => ({ ...p }))
    return {
      glyphs: run.glyphs, positions,
      get advanceWidth() { return positions.reduce((sum, p) => sum + p.xAdvance, 0) },
    }
  }) as unknown as fontkit.Font['layout']
  return cached
}

export type PdfStyle = 'body' | 'bold'
export type FaceChains = Record<PdfStyle, readonly Face[]>

/** Registers the bundled faces with a document; answers the chain of faces per style. */
export function registerPdfFonts(doc: PDFKit.PDFDocument, fonts: Map<string, LoadedFont>): FaceChains {
  // pdfkit takes a parsed fontkit font as it is (its types name only files and bytes).
  for (const [name, f] of fonts) doc.registerFont(name, f.font as unknown as Buffer)
  return { body: PDF_FACES.body.map(n => fonts.get(n)!.face), bold: PDF_FACES.bold.map(n => fonts.get(n)!.face) }
}

/** Writes text in runs of the face that has each character; the same options as doc.text. Answers the last face used. */
export function writeRuns(doc: PDFKit.PDFDocument, chains: FaceChains, text: string, style: PdfStyle,
  at?: { x: number, y: number }, opts: PDFKit.Mixins.TextOptions = {}) {
  const runs = fontRuns(text, chains[style])
  if (!runs.length) return chains[style][0]!.name
  runs.forEach((r, i) => {
    doc.font(r.face)
    const o = { ...opts, continued: i < runs.length - 1 || !!opts.continued }
    if (i === 0 && at) doc.text(r.text, at.x, at.y, o)
    else doc.text(r.text, o)
  })
  return runs.at(-1)!.face
}
