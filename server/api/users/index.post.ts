import { sql } from 'drizzle-orm'
import { userCreateSchema } from '#shared/schemas/users'

export default defineEventHandler(async (event) => {
  await requireRole(event, 'admin')
  const input = await readValidatedBody(event, validateWith(userCreateSchema))
  const taken = await useDb().query.users.findFirst({ where: sql`lower(${tables.users.email}) = ${input.email}` })
  if (taken) ruleError('email', 'Someone already signs in with this e-mail')
  const [row] = await useDb().insert(tables.users).values({
    email: input.email, name: input.name, role: input.role, phone: input.phone,
    passwordHash: await hashPassword(input.password),
  }).returning()
  setResponseStatus(event, 201)
  return publicUser(row!)
})
