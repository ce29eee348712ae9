// Photo bytes: PUT checks the declared SHA-256, the type by the file's own first bytes and the
// size, then keeps them in the `uploads` storage; GET hands them back to those who see the call.
import { createHash } from 'node:crypto'
import type { H3Event } from 'h3'
import { eq, sql } from 'drizzle-orm'
import { assertDeclaredLength, readCappedBody } from './body'

export type PhotoType = 'image/jpeg' | 'image/png' | 'image/webp'
const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])

/** The image type the bytes really are (JPEG, PNG or WebP), whatever the file was called. */
export function sniffImageType(b: Uint8Array): PhotoType | undefined {
  const buf = Buffer.from(b.buffer, b.byteOffset, b.byteLength)
  if (buf.length >= 3 && buf[0] === 0xff && buf[1] === 0xd8 && buf[2] === 0xff) return 'image/jpeg'
  if (buf.length >= 8 && buf.subarray(0, 8).equals(PNG_SIGNATURE)) return 'image/png'
  if (buf.length >= 12 && buf.toString('latin1', 0, 4) === 'RIFF' && buf.toString('latin1', 8, 12) === 'WEBP') return 'image/webp'
  return undefined
}

const storageKey = (id: string) => `photos:${id}`

function photoRule(status: number, field: string, message: string): never {
  throw createError({
    status, statusText: status === 415 ? 'Unsupported Media Type' : 'Unprocessable', message: `${field}: ${message}`,
    data: { fields: { [field]: message } },
  })
}

async function photoWithAccess(event: H3Event, id: string) {
  const photo = await useDb().query.photos.findFirst({ where: eq(tables.photos.id, id) })
  // The metadata op may still be on its way: 404 tells the device to send the bytes again later.
  if (!photo) throw createError({ status: 404, statusText: 'No such photo yet' })
  await requireCallAccess(event, photo.callId)
  return photo
}

export async function putPhotoBytes(event: H3Event, id: string) {
  await requireUser(event)
  const declared = (getRequestHeader(event, 'x-content-sha256') ?? '').trim().toLowerCase()
  if (!/^[0-9a-f]{64}$/.test(declared)) photoRule(400, 'X-Content-Sha256', 'send the hex SHA-256 of the bytes')
  const type = (getRequestHeader(event, 'content-type') ?? '').split(';')[0]!.trim().toLowerCase()
  if (!type.startsWith('image/') && type !== 'application/octet-stream') {
    photoRule(415, 'Content-Type', 'send the photo as image/* or application/octet-stream')
  }
  const max = Number(useRuntimeConfig().photoMaxBytes)
  assertDeclaredLength(event, max)
  const photo = await photoWithAccess(event, id)
  if (photo.sha256 && photo.sha256 !== declared) photoRule(422, 'X-Content-Sha256', 'differs from the photo\'s recorded SHA-256')

  const bytes = await readCappedBody(event, max)
  if (!bytes.length) photoRule(400, 'body', 'no bytes were sent')
  const actual = createHash('sha256').update(bytes).digest('hex')
  if (actual !== declared) photoRule(422, 'X-Content-Sha256', 'does not match the bytes received')
  const sniffed = sniffImageType(bytes)
  if (!sniffed) photoRule(415, 'body', 'not a JPEG, PNG or WebP image')

  const storage = useStorage('uploads')
  if (photo.storageKey && photo.uploadedAt && await storage.hasItem(photo.storageKey)) {
    const { contentType, sizeBytes, uploadedAt } = photo
    return { id, sha256: actual, contentType, sizeBytes, uploadedAt, stored: 'already' as const }
  }
  const key = storageKey(id)
  await storage.setItemRaw(key, bytes)
  const [row] = await useDb().update(tables.photos)
    .set({ storageKey: key, uploadedAt: sql`now()`, contentType: sniffed, sizeBytes: bytes.length, sha256: actual })
    .where(eq(tables.photos.id, id)).returning()
  const { contentType, sizeBytes, uploadedAt } = row!
  return { id, sha256: actual, contentType, sizeBytes, uploadedAt, stored: 'now' as const }
}

export async function getPhotoBytes(event: H3Event, id: string): Promise<Buffer> {
  const photo = await photoWithAccess(event, id)
  if (!photo.storageKey) throw createError({ status: 404, statusText: 'The photo is not uploaded yet' })
  const raw = await useStorage('uploads').getItemRaw(photo.storageKey)
  if (!raw) throw createError({ status: 404, statusText: 'The photo is not uploaded yet' })
  const bytes = Buffer.isBuffer(raw) ? raw : Buffer.from(raw as ArrayBuffer)
  setResponseHeaders(event, {
    'content-type': photo.contentType ?? 'application/octet-stream',
    'content-length': bytes.length,
    // The bytes behind an id never change (their hash is fixed), so the browser may keep them.
    'cache-control': 'private, max-age=31536000, immutable',
    'x-content-type-options': 'nosniff',
    'etag': `"${photo.sha256}"`,
  })
  return bytes
}
