// An in-memory stand-in for the sync routes, following DESIGN.md's protocol (seq per client,
// duplicates answered from the stored result, 409 past the next expected seq), so the device's
// engine can be driven without a network. `script` lets a test answer a request its own way.
import { createHash } from 'node:crypto'
import type { Op } from '../../app/utils/fieldDb'
import { emptyChanges } from './outbox-support'

type Stored = { opId: string, seq: number, status: string, reason?: string, version?: number }
export type Script = (url: string, init: RequestInit) => Response | undefined | Promise<Response | undefined>

export class FakeSyncServer {
  lastSeq = 0
  stored = new Map<number, Stored>()
  rows = new Map<string, Record<string, unknown>>()
  photos = new Map<string, string>()
  requests: { method: string, url: string, ops?: number, position?: unknown }[] = []
  pullChanges: Record<string, Record<string, unknown>[]> = {}
  /** A paged pull: each request answers the next page, with `more` while pages are left. */
  pullPages: Record<string, Record<string, unknown>[]>[] = []
  conflicts: Record<string, unknown>[] = []
  cursor = 0
  /** Ops whose data the server refuses, by entity id, with the reason. */
  refuse = new Map<string, string>()
  script?: Script

  fetch = async (url: string, init: RequestInit = {}): Promise<Response> => {
    const method = init.method ?? 'GET'
    const scripted = await this.script?.(url, init)
    const body = typeof init.body === 'string' ? JSON.parse(init.body) : undefined
    this.requests.push({ method, url, ops: body?.ops?.length, position: body?.position })
    if (scripted) return scripted
    if (url === '/api/sync/push' && method === 'POST') return this.push(body)
    if (url.startsWith('/api/sync/pull')) return this.pull()
    const photo = /^\/api\/photos\/([^/]+)$/.exec(url)
    if (photo && method === 'PUT') return this.putPhoto(photo[1]!, init)
    return json(404, { statusText: 'Not found' })
  }

  private push(body: { clientId: string, ops: Op[] }) {
    const results: Stored[] = []
    const first = body.ops[0]
    if (first && first.seq > this.lastSeq + 1) return json(409, { statusCode: 409, data: { expectedSeq: this.lastSeq + 1 } })
    for (const op of body.ops) {
      if (op.seq <= this.lastSeq) {
        results.push({ ...this.stored.get(op.seq)!, status: 'duplicate' })
        continue
      }
      if (op.seq !== this.lastSeq + 1) break
      const reason = this.refuse.get(op.entityId)
      const r: Stored = reason
        ? { opId: op.opId, seq: op.seq, status: 'rejected', reason }
        : { opId: op.opId, seq: op.seq, status: 'applied', version: 1 }
      if (!reason) this.rows.set(`${op.entity}:${op.entityId}`, { ...(this.rows.get(`${op.entity}:${op.entityId}`) ?? {}), ...op.changes })
      this.stored.set(op.seq, r)
      this.lastSeq = op.seq
      results.push(r)
    }
    return json(200, { lastSeq: this.lastSeq, results })
  }

  private pull() {
    this.cursor += 1
    const page = this.pullPages.shift()
    const changes = page ?? this.pullChanges
    if (!page) this.pullChanges = {}
    const more = this.pullPages.length > 0
    const answer = {
      cursor: String(this.cursor), lastSeq: this.lastSeq, changes: { ...emptyChanges(), ...changes }, conflicts: this.conflicts,
      revokedCallIds: [], more,
    }
    return json(200, answer)
  }

  private putPhoto(id: string, init: RequestInit) {
    const bytes = Buffer.from(init.body as ArrayBuffer)
    const sha = createHash('sha256').update(bytes).digest('hex')
    const claimed = new Headers(init.headers).get('X-Content-Sha256')
    if (claimed !== sha) return json(422, { statusText: 'X-Content-Sha256 does not match the bytes' })
    this.photos.set(id, sha)
    return json(200, { id, sha256: sha, sizeBytes: bytes.length })
  }
}

export function json(status: number, body: unknown, headers: Record<string, string> = {}) {
  return new Response(JSON.stringify(body), { status, headers: { 'content-type': 'application/json', ...headers } })
}
