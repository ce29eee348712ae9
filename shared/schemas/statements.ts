import { z } from 'zod'

/** Sending a statement: to the customer's billing e-mail unless another address is given. */
export const statementSendSchema = z.object({
  to: z.email('Enter an e-mail address like ap@fleet.example').max(254, 'At most 254 characters').optional(),
}).strict()
export type StatementSendInput = z.infer<typeof statementSendSchema>
