export const ROLES = ['mechanic', 'dispatcher', 'office', 'admin'] as const
export type Role = (typeof ROLES)[number]

export const ROLE_LABELS: Record<Role, string> = {
  mechanic: 'Mechanic',
  dispatcher: 'Dispatcher',
  office: 'Office',
  admin: 'Admin',
}

/** Where each role lands after signing in. */
export const ROLE_HOME: Record<Role, string> = {
  mechanic: '/m',
  dispatcher: '/dispatch',
  office: '/billing',
  admin: '/setup',
}
