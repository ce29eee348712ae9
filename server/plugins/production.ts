// A production start with a local secret or a local fake's address stops here, before serving,
// and says which variable to set (server/utils/productionConfig.ts).
export default defineNitroPlugin(() => {
  if (import.meta.prerender || !isProductionStart()) return
  const c = useRuntimeConfig()
  const problems = productionProblems({
    sessionPassword: process.env.NUXT_SESSION_PASSWORD ?? c.session?.password,
    cookieSecure: c.session?.cookie?.secure,
    databaseUrl: c.databaseUrl,
    smtpHost: c.smtpHost,
    smtpPort: Number(c.smtpPort),
    stripeSecretKey: c.stripeSecretKey,
    stripeWebhookSecret: c.stripeWebhookSecret,
    stripeApiHost: c.stripeApiHost,
    stripeApiProtocol: c.stripeApiProtocol,
    siteUrl: c.siteUrl,
    uploadsS3Bucket: c.uploadsS3Bucket,
    uploadsS3Endpoint: c.uploadsS3Endpoint,
    uploadsS3AccessKeyId: c.uploadsS3AccessKeyId,
  })
  if (!problems.length) return
  logLine('error', { event: 'refused-production-start', problems })
  process.stderr.write(`\nWayside will not start in production with local settings. Set:\n${problems.map(p => `  - ${p}`).join('\n')}\n`
    + 'Local runs (npm start, npm test) set WAYSIDE_LOCAL=1 and skip this check.\n\n')
  process.exit(1)
})
