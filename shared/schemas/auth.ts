import { z } from 'zod'

export const loginSchema = z.object({
  email: z.string().trim().toLowerCase().email('Enter an e-mail address').max(200),
  password: z.string().min(1, 'Enter your password').max(200),
})
export type LoginInput = z.infer<typeof loginSchema>
