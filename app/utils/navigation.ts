import type { Role } from '#shared/utils/roles'
import type { IconName } from '~/components/app/AppIcon.vue'

export type NavItem = { to: string, label: string, icon: IconName, roles: Role[] }

/** The links in the app bar; each role sees only its own. */
export const NAV_ITEMS: NavItem[] = [
  { to: '/m', label: 'My calls', icon: 'truck', roles: ['mechanic'] },
  { to: '/m/sync', label: 'Sync', icon: 'sync', roles: ['mechanic'] },
  { to: '/m/settings', label: 'Settings', icon: 'gear', roles: ['mechanic'] },
  { to: '/dispatch', label: 'Dispatch', icon: 'board', roles: ['dispatcher', 'admin'] },
  { to: '/dispatch/new', label: 'New call', icon: 'plus', roles: ['dispatcher', 'admin'] },
  { to: '/customers', label: 'Customers', icon: 'people', roles: ['dispatcher', 'admin'] },
  { to: '/units', label: 'Units', icon: 'truck', roles: ['dispatcher', 'admin'] },
  { to: '/calls', label: 'Calls', icon: 'list', roles: ['office', 'admin'] },
  { to: '/billing', label: 'Billing', icon: 'receipt', roles: ['office', 'admin'] },
  { to: '/reports', label: 'Reports', icon: 'gauge', roles: ['dispatcher', 'office', 'admin'] },
  { to: '/setup', label: 'Setup', icon: 'gear', roles: ['admin'] },
]

export function navFor(role: Role | undefined) {
  return role ? NAV_ITEMS.filter(i => i.roles.includes(role)) : []
}
