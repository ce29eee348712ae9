// Each app server works the job queue (mail) in its own process; the jobs live in PostgreSQL, so
// any number of servers share them and a restart picks up where the last one stopped.
export default defineNitroPlugin((nitro) => {
  if (import.meta.prerender) return
  const started = startJobs().catch((err) => {
    // The server still answers; mail waits in the database until a worker runs.
    console.error('[jobs] the job queue did not start:', (err as Error).message)
  })
  nitro.hooks.hook('close', async () => {
    await started
    await stopJobs()
  })
})
