// Answers go out compressed when the client takes it: a mechanic on one bar of signal waits on
// bytes, and JSON (the first pull above all) shrinks to a fraction. Static files are compressed
// once at build instead (nitro.compressPublicAssets in nuxt.config.ts).
import { bodyText, compressText, pickEncoding } from '../utils/compression'

export default defineNitroPlugin((nitroApp) => {
  nitroApp.hooks.hook('beforeResponse', async (event, response) => {
    const res = event.node.res
    if (event.method === 'HEAD' || res.statusCode === 204 || res.statusCode === 304 || res.headersSent) return
    if (res.getHeader('content-encoding')) return
    // Nitro's own fetches inside the server (the error page, server-side rendering's data) have no
    // socket: their bodies are read by code, not sent, so they stay plain.
    if (!event.node.req.socket?.remoteAddress) return
    const encoding = pickEncoding(getRequestHeader(event, 'accept-encoding'))
    if (!encoding) return
    const text = bodyText(response.body, String(res.getHeader('content-type') ?? ''))
    if (!text) return
    const packed = await compressText(text.body, encoding)
    if (!packed) return
    setResponseHeader(event, 'content-type', text.type)
    setResponseHeader(event, 'content-encoding', encoding)
    appendResponseHeader(event, 'vary', 'Accept-Encoding')
    response.body = packed
  })
})
