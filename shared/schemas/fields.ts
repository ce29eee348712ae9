import { z } from 'zod'

// Small field builders the office forms share. An empty box means "none": '' becomes null, and
// undefined stays undefined so a PATCH leaves the field alone.

/** PostgreSQL text cannot hold a NUL character: refuse it here, naming the field, not at the database. */
export const noNul = (s: string | null | undefined) => !s?.includes('\u0000')
export const NUL_MESSAGE = 'May not contain a NUL character'

/** Optional free text; '' and spaces become null. */
export const optText = (max: number, label = 'This') =>
  z.string({ message: `${label} must be text` }).trim().max(max, `${label} is too long (at most ${max} characters)`)
    .refine(noNul, NUL_MESSAGE)
    .nullable().optional().transform(v => (v === '' ? null : v))

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
  q: z.string().trim().max(100).optional(),
}
