import { and, eq } from 'drizzle-orm'

/** A mechanic's shift: on duty ranks them first in dispatch's suggestions. Null when no such active mechanic. */
export async function setMechanicDuty(mechanicId: string, onDuty: boolean) {
  const { users } = tables
  const [row] = await useDb().update(users).set({ onDuty })
    .where(and(eq(users.id, mechanicId), eq(users.role, 'mechanic'), eq(users.active, true)))
    .returning({ id: users.id, name: users.name, onDuty: users.onDuty })
  return row ?? null
}

export async function mechanicDuty(mechanicId: string) {
  const [row] = await useDb().select({ id: tables.users.id, onDuty: tables.users.onDuty })
    .from(tables.users).where(eq(tables.users.id, mechanicId))
  return row ?? null
}
