// The rows the sync carries, typed from the database schema's own row types: what the pull answers
// (JSON, so dates arrive as ISO text) and what the phone keeps of each. Type-only: nothing of the
// server's code reaches the phone's bundle.
import type * as db from '../../server/db/schema'

/** A row as JSON carries it: dates become ISO text, the rest is as stored. */
export type AsJson<T> = { [K in keyof T]: T[K] extends Date ? string : T[K] extends Date | null ? string | null : T[K] }
type Row<T extends { $inferSelect: object }> = AsJson<T['$inferSelect']>

export type CallWire = Row<typeof db.calls>
export type UnitWire = Row<typeof db.units>
export type CustomerWire = Row<typeof db.customers>
export type CallEventWire = Row<typeof db.callEvents>
export type FaultCodeWire = Row<typeof db.faultCodes>
export type TestRunWire = Row<typeof db.testRuns>
export type ReadingWire = Row<typeof db.readings>
export type NoteWire = Row<typeof db.notes>
export type PhotoWire = Row<typeof db.photos>
export type ClockEventWire = Row<typeof db.clockEvents>
export type PartLineWire = Row<typeof db.partLines>
export type SignOffWire = Row<typeof db.signOffs>
export type ConflictWire = Row<typeof db.conflicts>
export type ApprovalRequestWire = Row<typeof db.approvalRequests>
export type ApprovalWire = Row<typeof db.approvals>
export type EstimateSignatureWire = Row<typeof db.estimateSignatures>
export type RatesWire = Row<typeof db.rates>

/**
 * What the phone keeps of a row: the server's row once pulled, or until then the create it queued
 * (the server's own columns not yet known), so every column may be missing but the id. Other keys
 * stay readable as unknown: marks the phone keeps for itself, or a column a newer server sends.
 */
export type DeviceRecord<R extends object = object> = Partial<R> & { id: string } & { [key: string]: unknown }
