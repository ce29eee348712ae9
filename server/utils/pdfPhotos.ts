// The photos the office marked for the customer (`photos.show_customer`), as bytes a PDF can embed.
import { and, asc, eq, isNotNull } from 'drizzle-orm'

export type PdfImage = { caption: string | null, bytes: Buffer }

/** The call's marked photos, oldest first; pdfkit embeds JPEG and PNG, so a WebP photo stays on the call page. */
export async function markedPhotoImages(callId: string): Promise<PdfImage[]> {
  const { photos } = tables
  const marked = await useDb().select().from(photos)
    .where(and(eq(photos.callId, callId), eq(photos.showCustomer, true), isNotNull(photos.storageKey))).orderBy(asc(photos.createdAt))
  const images: PdfImage[] = []
  for (const p of marked) {
    const raw = await useStorage('uploads').getItemRaw(p.storageKey!)
    if (raw && (p.contentType === 'image/jpeg' || p.contentType === 'image/png')) {
      images.push({ caption: p.caption, bytes: Buffer.isBuffer(raw) ? raw : Buffer.from(raw as ArrayBuffer) })
    }
  }
  return images
}
