// Each app server works the job queue (mail) in its own process; the jobs live in PostgreSQL, so
// any number of servers share them and a restart picks up where the last one stopped. A server that
// comes up before its database keeps trying to start the queue; meanwhile mail waits in the database.
export default defineNitroPlugin((nitro) => {
  if (import.meta.prerender) return
  let closing = false
  let attempt: Promise<void> | undefined
  void keepTrying(() => (attempt = startJobs()), {
    isClosing: () => closing,
    onFailure: (err, waitMs) => {
      console.error(`[jobs] the job queue did not start (${(err as Error).message}); trying again in ${waitMs / 1000} s`)
    },
  })
  nitro.hooks.hook('close', async () => {
    closing = true
    // A start under way finishes (or fails) before the queue is stopped, so no worker is left running.
    await attempt?.catch(() => undefined)
    await stopJobs()
  })
})
