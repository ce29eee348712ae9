// Every request gets an id (X-Request-Id, kept when the caller sent a sane one) that goes back in
// the answer's header, into JSON error bodies and onto the error page, and one log line when the
// answer is done: method, path (without the query, which may hold search text), status, duration.
export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('request', (event) => {
    const requestId = requestIdFor(event)
    event.context.requestId = requestId
    // Nuxt renders its error page through an internal request that copies these headers.
    event.node.req.headers['x-request-id'] = requestId
    setResponseHeader(event, 'x-request-id', requestId)
    const started = performance.now()
    let logged = false
    const done = () => {
      if (logged) return
      logged = true
      const res = event.node.res
      const status = res.statusCode
      // A load balancer's health probe every few seconds would drown the log while all is well.
      if (event.path === '/api/health' && status === 200) return
      logLine(status >= 500 ? 'error' : 'info', {
        requestId,
        method: event.method,
        path: event.path.split('?')[0],
        status,
        durationMs: Math.round((performance.now() - started) * 10) / 10,
        ...(res.writableFinished ? {} : { aborted: true }),
        ...(event.node.req.socket?.remoteAddress ? {} : { internal: true }),
        ...(event.context.waysideUser ? { userId: (event.context.waysideUser as { id: string }).id } : {}),
      })
    }
    event.node.res.once('finish', done)
    event.node.res.once('close', done)
  })
})
