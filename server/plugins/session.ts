// nuxt-auth-utils' own session endpoint (GET /api/_auth/session) reads only the sealed cookie; this
// hook holds it to the same rule as every other route, so a session that was ended (signed out
// elsewhere, a new password, the account turned off) reports nobody.
export default defineNitroPlugin(() => {
  sessionHooks.hook('fetch', async (session, event) => {
    const user = await currentUser(event)
    if (user) {
      session.user = user
      return
    }
    for (const key of Object.keys(session)) {
      if (key !== 'id') Reflect.deleteProperty(session, key)
    }
  })
})
