import { z } from 'zod'
import { searchQuery, text, type TextOptions } from './text'

// Small field builders the office forms share. An empty box means "none": '' becomes null, and
// undefined stays undefined so a PATCH leaves the field alone.

/** Optional free text; '' and spaces become null (the shared text schema: no control characters). */
export const optText = (max: number, label = 'This', opts: TextOptions = {}) => text(max, label, opts)

/** Optional whole number within a range; null clears it. */
export const optInt = (min: number, max: number, label: string) =>
  z.number({ message: `${label} must be a number` }).int(`${label} must be a whole number`)
    .min(min, `${label} cannot be below ${min}`).max(max, `${label} cannot be above ${max}`).nullable().optional()

/** A record id in a body, with a message naming what is missing. */
export const recordId = (what: string) => z.string({ message: `Pick ${what}` }).uuid(`Pick ${what}`)

/** The version the client last saw, for optimistic concurrency. */
export const versionField = z.number({ message: 'version is required: reload the record' }).int().min(1)

/** Paging and sorting shared by the office lists. */
export const pageQuery = {
  page: z.coerce.number({ message: 'Page must be a number' }).int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number({ message: 'Page size must be a number' }).int().min(1).max(200).default(25),
  dir: z.enum(['asc', 'desc']).optional(),
  q: searchQuery,
}
