import { z } from 'zod'
import { ROLES } from '../utils/roles'

const password = z.string().min(10, 'Use at least 10 characters').max(200)

export const userCreateSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address').max(200),
  name: z.string().trim().min(1, 'Enter a name').max(120),
  role: z.enum(ROLES, { message: 'Pick a role' }),
  phone: z.string().trim().max(40).optional(),
  password,
})

export const userPatchSchema = z.object({
  name: z.string().trim().min(1, 'Enter a name').max(120).optional(),
  role: z.enum(ROLES, { message: 'Pick a role' }).optional(),
  phone: z.string().trim().max(40).nullable().optional(),
  active: z.boolean().optional(),
  onDuty: z.boolean().optional(),
  password: password.optional(),
  /** A mechanic's home truck: the stock their part lines come from unless the call names another. */
  homeTruckId: z.string({ message: 'Pick a truck' }).uuid('Pick a truck').nullable().optional(),
}).refine(v => Object.keys(v).length > 0, { message: 'Nothing to change' })

export const idParamsSchema = z.object({ id: z.string().uuid('Not a valid id') })

export type UserCreateInput = z.infer<typeof userCreateSchema>
export type UserPatchInput = z.infer<typeof userPatchSchema>
