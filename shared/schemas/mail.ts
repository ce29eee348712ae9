import { z } from 'zod'

export const mailListQuerySchema = z.object({
  relatedId: z.string({ message: 'Name the record (relatedId)' }).uuid('Not a valid record id'),
})
