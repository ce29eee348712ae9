import { z } from 'zod'

export const CALL_STATUSES = ['received', 'assigned', 'en_route', 'on_site', 'completed', 'invoiced', 'paid', 'cancelled'] as const
export const CALL_OUTCOMES = ['repaired', 'towed', 'parts_ordered', 'no_fault_found'] as const
export type CallStatus = (typeof CALL_STATUSES)[number]
export type CallOutcome = (typeof CALL_OUTCOMES)[number]

/** Query of GET /api/calls; `status` may list several, comma-separated. */
export const callListQuerySchema = z.object({
  status: z.string().optional().transform((s, ctx) => {
    if (!s) return undefined
    const list = s.split(',').map(x => x.trim()).filter(Boolean)
    for (const x of list) {
      if (!(CALL_STATUSES as readonly string[]).includes(x)) {
        ctx.addIssue({ code: 'custom', message: `Unknown status "${x}"` })
        return z.NEVER
      }
    }
    return list as CallStatus[]
  }),
  open: z.enum(['true', 'false']).optional().transform(v => v === 'true'),
  mechanicId: z.string().uuid('Not a valid mechanic id').optional(),
  customerId: z.string().uuid('Not a valid customer id').optional(),
  unitId: z.string().uuid('Not a valid unit id').optional(),
  q: z.string().trim().max(100).optional(),
  sort: z.enum(['number', 'receivedAt', 'statusChangedAt', 'status']).optional(),
  dir: z.enum(['asc', 'desc']).optional(),
  page: z.coerce.number({ message: 'Page must be a number' }).int().min(1).max(10_000).default(1),
  pageSize: z.coerce.number({ message: 'Page size must be a number' }).int().min(1).max(200).default(50),
})
export type CallListQuery = z.input<typeof callListQuerySchema>
