// The server's side of the entity registry: each record entity's table, keyed by the registry's
// names. The table is the one in server/db/schema.ts named like the entity's collection, so a new
// entity needs no entry here; the type check below fails when that table is missing.
import type { PgColumn, PgTable } from 'drizzle-orm/pg-core'
import {
  RECORD_COLLECTIONS, RECORD_ENTITY_NAMES, SERVER_COLLECTION_NAMES, type RecordCollection, type RecordEntityName, type ServerCollection,
} from '#shared/sync/entities'
import { tables } from '../db'

export type RecordTable = PgTable & { id: PgColumn, callId: PgColumn, version: PgColumn, changeXid: PgColumn }

// Every collection in the registry must be a table with the record columns.
const byCollection: Record<RecordCollection | ServerCollection, RecordTable> = tables

/** reading → tables.readings, and so on for every record entity. */
export const RECORD_TABLES = Object.fromEntries(
  RECORD_ENTITY_NAMES.map(name => [name, byCollection[RECORD_COLLECTIONS[name]]]),
) as Record<RecordEntityName, RecordTable>

/** Server-made records of a call that the pull hands out beside the device's own. */
export const SERVER_RECORD_TABLES = Object.fromEntries(SERVER_COLLECTION_NAMES.map(c => [c, byCollection[c]])) as
  Record<ServerCollection, RecordTable>

/** Every table of records under a call, by the pull's collection name. */
const recordTablesByCollection = Object.fromEntries(RECORD_ENTITY_NAMES.map(name => [RECORD_COLLECTIONS[name], RECORD_TABLES[name]]))
export const CALL_RECORD_TABLES = {
  ...recordTablesByCollection as Record<RecordCollection, RecordTable>,
  ...SERVER_RECORD_TABLES,
}
export type CallRecordCollection = keyof typeof CALL_RECORD_TABLES
