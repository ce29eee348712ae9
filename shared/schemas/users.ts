import { z } from 'zod'
import { ROLES } from '../utils/roles'
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH, passwordProblem } from '../utils/passwordStrength'
import { cleanText, hasControlCharacter, requiredText } from './text'

// A new password: the length rule and the guessability check (shared/utils/passwordStrength.ts),
// with the reason shown beside the box. Never trimmed: spaces are part of a password.
const password = z.string({ message: 'Enter a password' })
  .min(PASSWORD_MIN_LENGTH, `Use at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(PASSWORD_MAX_LENGTH, `Use at most ${PASSWORD_MAX_LENGTH} characters`)
  .refine(p => !hasControlCharacter(p), 'A password cannot hold tabs, line breaks or control characters')

function strongEnough(v: { password?: string, name?: string | null, email?: string }, ctx: z.RefinementCtx) {
  if (v.password === undefined || v.password.length < PASSWORD_MIN_LENGTH || v.password.length > PASSWORD_MAX_LENGTH) return
  const problem = passwordProblem(v.password, [v.name, v.email])
  if (problem) ctx.addIssue({ code: 'custom', path: ['password'], message: problem })
}

const name = requiredText(120, 'Name', { missing: 'Enter a name' })

export const userCreateSchema = z.object({
  email: cleanText('E-mail').toLowerCase().email('Enter an e-mail address').max(200),
  name,
  role: z.enum(ROLES, { message: 'Pick a role' }),
  phone: cleanText('Phone').max(40, 'Phone is too long (at most 40 characters)').optional(),
  password,
}).superRefine(strongEnough)

export const userPatchSchema = z.object({
  name: name.optional(),
  role: z.enum(ROLES, { message: 'Pick a role' }).optional(),
  phone: cleanText('Phone').max(40, 'Phone is too long (at most 40 characters)').nullable().optional(),
  active: z.boolean().optional(),
  onDuty: z.boolean().optional(),
  password: password.optional(),
  /** A mechanic's home truck: the stock their part lines come from unless the call names another. */
  homeTruckId: z.string({ message: 'Pick a truck' }).uuid('Pick a truck').nullable().optional(),
}).superRefine(strongEnough).refine(v => Object.keys(v).length > 0, { message: 'Nothing to change' })

/** A record id in the path, made canonical (lower case) so one record never has two spellings. */
export const idParamsSchema = z.object({ id: z.string().trim().toLowerCase().uuid('Not a valid id') })

export type UserCreateInput = z.input<typeof userCreateSchema>
export type UserPatchInput = z.input<typeof userPatchSchema>

/** Start or end a shift: a mechanic for themself (POST /api/me/duty), dispatch for a mechanic (POST /api/mechanics/[id]/duty). */
export const dutySchema = z.object({
  onDuty: z.boolean({ message: 'Say whether on duty: true or false' }),
})
export type DutyInput = z.input<typeof dutySchema>
