import { z } from 'zod'

const address = (what: string) => z.string({ message: `${what} must be text` }).trim().toLowerCase()
  .max(200, `${what} is too long`).pipe(z.email(`Enter an e-mail address like ops@fleet.example`))

/** POST /api/calls/[id]/share: a new status link; with `sendTo` it is also e-mailed there. */
export const shareCreateSchema = z.object({
  sendTo: address('The address').optional(),
})
export type ShareCreateInput = z.input<typeof shareCreateSchema>

/** POST /api/calls/[id]/report: the service report e-mailed to the fleet's contact. */
export const reportSendSchema = z.object({
  to: address('The address'),
})
export type ReportSendInput = z.input<typeof reportSendSchema>
