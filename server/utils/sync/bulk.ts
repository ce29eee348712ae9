// Many rows in one INSERT … SELECT FROM json_populate_recordset(…): the rows travel as one JSON
// parameter (JSON.stringify is native and fast) and PostgreSQL turns them into typed records, so a
// 500-op push costs one statement per table and little CPU on our side.
// A new row's version is always 1 (the wayside_touch trigger), so only the ids come back.
import { getTableColumns, sql, type SQL } from 'drizzle-orm'
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core'
import type { Tx } from '../db'

/**
 * The INSERT for `rows` (all with the same keys, named as the table's properties). Rows that clash
 * with an existing one are skipped, unless skipClashes is false (then the statement fails).
 */
export function bulkInsertSql(
  table: PgTable, rows: Record<string, unknown>[], opts: { returning?: boolean, skipClashes?: boolean } = {},
): SQL {
  const columns = getTableColumns(table) as Record<string, PgColumn>
  const keys = Object.keys(rows[0] ?? {})
  const names = keys.map((key) => {
    const column = columns[key]
    if (!column) throw new Error(`bulkInsert: ${key} is not a column`)
    return column.name
  })
  const records = rows.map((r) => {
    const o: Record<string, unknown> = {}
    for (let i = 0; i < keys.length; i++) o[names[i]!] = r[keys[i]!] ?? null
    return o
  })
  const list = sql.join(names.map(n => sql.identifier(n)), sql`, `)
  const clashes = opts.skipClashes === false ? sql`` : sql` ON CONFLICT DO NOTHING`
  const returning = opts.returning === false ? sql`` : sql` RETURNING id`
  const source = sql`json_populate_recordset(NULL::${table}, ${JSON.stringify(records)}::json)`
  return sql`INSERT INTO ${table} (${list}) SELECT ${list} FROM ${source}${clashes}${returning}`
}

/** Inserts `rows`, skipping those that clash with an existing row, and answers the ids written. */
export async function bulkInsert(tx: Tx, table: PgTable, rows: Record<string, unknown>[]): Promise<string[]> {
  if (!rows.length) return []
  const res = await tx.execute<{ id: string }>(bulkInsertSql(table, rows))
  return res.rows.map(r => r.id)
}
