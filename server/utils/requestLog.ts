// One JSON line per event on standard output, for whatever collects the logs (journald, a
// container runtime, a log shipper). Never a person's password, cookie or request body.
import { randomUUID } from 'node:crypto'
import type { H3Event } from 'h3'

export type LogLevel = 'info' | 'warn' | 'error'

export function logLine(level: LogLevel, fields: Record<string, unknown>) {
  const line = JSON.stringify({ time: new Date().toISOString(), level, ...fields })
  if (level === 'error') process.stderr.write(`${line}\n`)
  else process.stdout.write(`${line}\n`)
}

// A caller's own id is kept when it looks like one (a load balancer's or a client's); anything
// else is replaced, so a log line can never be forged or blown up through this header.
const SANE_REQUEST_ID = /^[A-Za-z0-9._:-]{8,128}$/

/** The request's id: the incoming X-Request-Id when sane, otherwise a new UUID. */
export function requestIdFor(event: H3Event): string {
  const incoming = event.node.req.headers['x-request-id']
  const id = typeof incoming === 'string' ? incoming.trim() : ''
  return SANE_REQUEST_ID.test(id) ? id : randomUUID()
}
