// What a card customer's driver signed before the work, for the office's invoice page: oldest first,
// the newest in force (the rule is shared/utils/estimateSigning.ts).
import { asc, eq } from 'drizzle-orm'

export async function signedEstimatesOf(callId: string) {
  const es = tables.estimateSignatures
  return useDb().select({
    id: es.id, driverName: es.driverName, amountCents: es.amountCents, signedAt: es.signedAt, work: es.work,
  }).from(es).where(eq(es.callId, callId)).orderBy(asc(es.signedAt))
}
