import { ROLE_HOME } from '#shared/utils/roles'

export default defineNuxtRouteMiddleware(async (to) => {
  if (to.meta.public) return
  const who = await useCurrentUser().resolve()
  if (!who) return navigateTo({ path: '/login', query: to.fullPath !== '/' ? { next: to.fullPath } : {} })
  if (to.meta.roles && !to.meta.roles.includes(who.role)) return navigateTo(ROLE_HOME[who.role])
})
