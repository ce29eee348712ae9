import { desc, lte } from 'drizzle-orm'
import type { z } from 'zod'
import type { ratesSchema } from '#shared/schemas/rates'

/** What a shop with no rates yet drives at, for drive-time estimates only. */
export const FALLBACK_ROAD_KPH = 60

/** The rates in force: the newest row that has taken effect, or null when the admin set none. */
export async function ratesInForce() {
  const [row] = await useDb().select().from(tables.rates).where(lte(tables.rates.effectiveFrom, new Date()))
    .orderBy(desc(tables.rates.effectiveFrom), desc(tables.rates.createdAt)).limit(1)
  return row ? withoutXid(row) : null
}

/** A change of rates is a new row from now on, so invoices keep the rates they were priced with. */
export async function setRates(input: z.output<typeof ratesSchema>) {
  const [row] = await useDb().insert(tables.rates).values({ ...input, effectiveFrom: new Date() }).returning()
  return withoutXid(row!)
}
