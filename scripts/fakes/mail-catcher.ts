// A local SMTP catcher: accepts every message on loopback, keeps it in memory and in
// .data/mail/, and serves the parsed messages back over HTTP so tests can read them.
// `POST /stall` makes it take connections and then say nothing (a hung mail server) until
// `POST /recover`.
import { createServer } from 'node:http'
import { mkdirSync, writeFileSync } from 'node:fs'
import { join } from 'node:path'
import { SMTPServer } from 'smtp-server'
import { simpleParser } from 'mailparser'

export type CaughtMessage = {
  id: number
  to: string[]
  from: string
  subject: string
  text: string
  html: string
  attachments: { filename: string, contentType: string, size: number }[]
  receivedAt: string
}

export async function startMailCatcher(opts: { smtpPort: number, httpPort: number, dir?: string }) {
  const messages: CaughtMessage[] = []
  let nextId = 1
  let stalled = false
  const held: ((err?: Error) => void)[] = []
  if (opts.dir) mkdirSync(opts.dir, { recursive: true })

  const smtp = new SMTPServer({
    secure: false,
    authOptional: true,
    disabledCommands: ['STARTTLS'],
    logger: false,
    onConnect(_session, callback) {
      if (!stalled) return callback()
      held.push(callback)
    },
    onData(stream, _session, callback) {
      const chunks: Buffer[] = []
      stream.on('data', (c: Buffer) => chunks.push(c))
      stream.on('end', async () => {
        const raw = Buffer.concat(chunks)
        try {
          const parsed = await simpleParser(raw)
          const toField = Array.isArray(parsed.to) ? parsed.to : parsed.to ? [parsed.to] : []
          const msg: CaughtMessage = {
            id: nextId++,
            to: toField.flatMap(a => a.value.map(v => v.address ?? '')),
            from: parsed.from?.value[0]?.address ?? '',
            subject: parsed.subject ?? '',
            text: parsed.text ?? '',
            html: typeof parsed.html === 'string' ? parsed.html : '',
            attachments: parsed.attachments.map(a => ({ filename: a.filename ?? '', contentType: a.contentType, size: a.size })),
            receivedAt: new Date().toISOString(),
          }
          messages.push(msg)
          if (opts.dir) writeFileSync(join(opts.dir, `${Date.now()}-${msg.id}.eml`), raw)
          callback()
        }
        catch (err) { callback(err as Error) }
      })
    },
  })
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject)
    smtp.listen(opts.smtpPort, '127.0.0.1', () => resolve())
  })

  const http = createServer((req, res) => {
    if (req.url === '/messages' && req.method === 'GET') {
      res.setHeader('content-type', 'application/json')
      res.end(JSON.stringify(messages))
    }
    else if (req.url === '/messages' && req.method === 'DELETE') {
      messages.length = 0
      res.statusCode = 204
      res.end()
    }
    else if ((req.url === '/stall' || req.url === '/recover') && req.method === 'POST') {
      stalled = req.url === '/stall'
      // Connections held while stalled are turned away; their clients gave up long ago.
      if (!stalled) {
        for (const release of held.splice(0)) {
          try {
            release(Object.assign(new Error('Try again'), { responseCode: 421 }))
          }
          catch { /* the client closed it */ }
        }
      }
      res.statusCode = 204
      res.end()
    }
    else {
      res.statusCode = 404
      res.end()
    }
  })
  await new Promise<void>((resolve, reject) => {
    http.once('error', reject)
    http.listen(opts.httpPort, '127.0.0.1', () => resolve())
  })

  return {
    messages,
    async close() {
      await new Promise<void>(r => smtp.close(() => r()))
      await new Promise<void>(r => http.close(() => r()))
    },
  }
}
