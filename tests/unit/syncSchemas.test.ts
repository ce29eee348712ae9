import { randomUUID } from 'node:crypto'
import { describe, expect, it } from 'vitest'
import { faultCodeCreateSchema, pushBodySchema, readingCreateSchema, signOffCreateSchema } from '#shared/schemas/sync'
import { jsonDeeperThan } from '~~/server/utils/sync/body'
import { sniffImageType } from '~~/server/utils/sync/photos'

const callId = randomUUID()
const op = (seq: number, over: Record<string, unknown> = {}) => ({
  opId: randomUUID(), clientId: CLIENT, seq, at: '2026-03-01T10:00:00.000Z', schemaVersion: 1, entity: 'note',
  entityId: randomUUID(), action: 'create', changes: { callId, text: 'x' }, ...over,
})
const CLIENT = randomUUID()

describe('sync envelope', () => {
  it('accepts a well-formed push', () => {
    expect(pushBodySchema.safeParse({ clientId: CLIENT, ops: [op(1), op(2)] }).success).toBe(true)
  })

  it('names the field of a string where a number belongs and of an unknown entity', () => {
    const r = pushBodySchema.safeParse({ clientId: CLIENT, ops: [op(1), op(2, { seq: '2' }), op(3, { entity: 'invoice' })] })
    expect(r.error!.issues.map(i => i.path.join('.'))).toEqual(['ops.1.seq', 'ops.2.entity'])
  })

  it('refuses ops out of seq order and a repeated opId', () => {
    const first = op(1)
    const r = pushBodySchema.safeParse({ clientId: CLIENT, ops: [op(2), first, { ...first, seq: 3 }] })
    expect(r.error!.issues.map(i => i.path.join('.'))).toEqual(['ops.1.seq', 'ops.2.opId'])
  })

  it('refuses more than 500 ops and ops of another client', () => {
    const many = Array.from({ length: 501 }, (_, i) => op(i + 1))
    expect(pushBodySchema.safeParse({ clientId: CLIENT, ops: many }).success).toBe(false)
    const other = pushBodySchema.safeParse({ clientId: CLIENT, ops: [op(1, { clientId: randomUUID() })] })
    expect(other.error!.issues[0]!.path.join('.')).toBe('ops.0.clientId')
  })
})

describe('create shapes', () => {
  it('reads a reading and names a string value', () => {
    expect(readingCreateSchema.safeParse({ callId, label: 'Sensor resistance', quantity: 'resistance', value: 138.5, unit: 'ohm' }).success)
      .toBe(true)
    const bad = readingCreateSchema.safeParse({ callId, label: 'x', quantity: 'resistance', value: '138.5', unit: 'ohm' })
    expect(bad.error!.issues[0]!.path).toEqual(['value'])
  })

  it('normalizes a J2012 code with parseDtc and refuses a malformed one', () => {
    // SAE J2012: P0118 is the engine coolant temperature circuit high code.
    expect(faultCodeCreateSchema.parse({ callId, code: ' p0118 ' }).code).toBe('P0118')
    expect(faultCodeCreateSchema.safeParse({ callId, code: 'X1234' }).error!.issues[0]!.path).toEqual(['code'])
    expect(faultCodeCreateSchema.safeParse({ callId, spn: 110, fmi: 0 }).success).toBe(true)
    expect(faultCodeCreateSchema.safeParse({ callId, spn: 110 }).error!.issues[0]!.path).toEqual(['fmi'])
    expect(faultCodeCreateSchema.safeParse({ callId, code: 'P0118', spn: 110, fmi: 0 }).success).toBe(false)
  })

  it('takes a signature only as an image data URL', () => {
    expect(signOffCreateSchema.safeParse({ callId, driverName: 'J. Driver', signature: 'data:image/png;base64,iVBORw0KGgo=' }).success)
      .toBe(true)
    expect(signOffCreateSchema.safeParse({ callId, driverName: 'J. Driver', signature: 'javascript:alert(1)' }).error!.issues[0]!.path)
      .toEqual(['signature'])
  })
})

describe('body guards', () => {
  it('measures nesting depth without being fooled by brackets inside strings', () => {
    expect(jsonDeeperThan('{"a":[{"b":1}]}', 3)).toBe(false)
    expect(jsonDeeperThan('{"a":[{"b":[1]}]}', 3)).toBe(true)
    expect(jsonDeeperThan('{"a":"[[[[[[\\"[[[["}', 1)).toBe(false)
    expect(jsonDeeperThan('['.repeat(100_000), 16)).toBe(true)
  })

  // Signatures: JPEG SOI marker FF D8 FF (ITU T.81), PNG 8-byte signature (ISO/IEC 15948 §5.2),
  // WebP 'RIFF' size 'WEBP' (RFC 9649 §2).
  it('tells images by their first bytes, not their name', () => {
    expect(sniffImageType(Buffer.from([0xff, 0xd8, 0xff, 0xe0, 0, 0]))).toBe('image/jpeg')
    expect(sniffImageType(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))).toBe('image/png')
    expect(sniffImageType(Buffer.concat([Buffer.from('RIFF'), Buffer.from([1, 0, 0, 0]), Buffer.from('WEBPVP8 ')]))).toBe('image/webp')
    expect(sniffImageType(Buffer.from('just some text, named photo.jpg'))).toBeUndefined()
    expect(sniffImageType(Buffer.from([0xff, 0xd8]))).toBeUndefined()
  })
})
