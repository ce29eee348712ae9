// The calls list's text search, on trigram indexes (pg_trgm, migration 0015): a call's own words in
// one indexed expression, and the customers and units whose name, number or VIN match, found first
// so the calls query reads each by its index. Fields are joined with a unit separator (0x1F), a
// character a search cannot hold (shared/schemas/text.ts refuses control characters), so a match
// never spans two fields.
import { ilike, or, sql, type SQL } from 'drizzle-orm'
import { tables, type Db } from './db'

/** More matching customers or units than this and the search reads only the first (a word that broad finds nothing useful). */
export const SEARCH_MATCH_CAP = 5000

const SEP = sql.raw(`E'\\x1f'`)

/** The words of a call a search reads, exactly as the trigram index calls_search_trgm is built. */
export const callSearchText = () => {
  const { calls } = tables
  return sql`(${calls.locationText} || ${SEP} || ${calls.complaint} || ${SEP} || coalesce(${calls.poNumber}, ''))`
}

/** A unit's number and VIN, as units_search_trgm is built. */
export const unitSearchText = () => sql`(${tables.units.unitNumber} || ${SEP} || coalesce(${tables.units.vin}, ''))`

/** `%term%` for ILIKE, with the term's own wildcards taken literally. */
export const likeTerm = (term: string) => `%${term.replace(/[%_\\]/g, m => `\\${m}`)}%`

/** A condition on calls alone for the search `term`: each part uses an index of calls. */
export async function callSearchCondition(db: Db, term: string): Promise<SQL> {
  const { calls, customers, units } = tables
  const like = likeTerm(term)
  const [customerIds, unitIds] = await Promise.all([
    db.select({ id: customers.id }).from(customers).where(ilike(customers.name, like)).limit(SEARCH_MATCH_CAP),
    db.select({ id: units.id }).from(units).where(sql`${unitSearchText()} ILIKE ${like}`).limit(SEARCH_MATCH_CAP),
  ])
  const parts: SQL[] = [sql`${callSearchText()} ILIKE ${like}`]
  if (customerIds.length) parts.push(sql`${calls.customerId} = ANY(${`{${customerIds.map(r => r.id).join(',')}}`}::uuid[])`)
  if (unitIds.length) parts.push(sql`${calls.unitId} = ANY(${`{${unitIds.map(r => r.id).join(',')}}`}::uuid[])`)
  if (/^\d{1,9}$/.test(term)) parts.push(sql`${calls.number} = ${Number(term)}`)
  return or(...parts)!
}
