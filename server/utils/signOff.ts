import { eq } from 'drizzle-orm'

/** The driver's sign-off on a call (name, drawn signature, when), or null while unsigned. */
export async function signOffOf(callId: string) {
  const s = tables.signOffs
  const [row] = await useDb().select({
    id: s.id, driverName: s.driverName, signature: s.signature, deviceAt: s.deviceAt, createdAt: s.createdAt,
  }).from(s).where(eq(s.callId, callId))
  return row ?? null
}
