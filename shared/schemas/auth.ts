import { z } from 'zod'
import { cleanText, hasControlCharacter } from './text'

export const loginSchema = z.object({
  email: cleanText('E-mail').toLowerCase().email('Enter an e-mail address').max(200),
  password: z.string({ message: 'Enter your password' }).min(1, 'Enter your password').max(200)
    .refine(p => !hasControlCharacter(p), 'A password cannot hold tabs, line breaks or control characters'),
})
export type LoginInput = z.infer<typeof loginSchema>
