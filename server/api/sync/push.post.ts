import { pushBodySchema, SYNC_MAX_BODY_BYTES, SYNC_MAX_DEPTH } from '#shared/schemas/sync'
import { parseOr400, readCappedJson } from '../../utils/sync/body'
import { SyncSeqGapError, syncPush } from '../../utils/sync/push'

export default defineEventHandler(async (event) => {
  const user = await requireUser(event)
  const body = parseOr400(pushBodySchema, await readCappedJson(event, { maxBytes: SYNC_MAX_BODY_BYTES, maxDepth: SYNC_MAX_DEPTH }))
  try {
    return await syncPush(user, body, { userAgent: getRequestHeader(event, 'user-agent') })
  }
  catch (err) {
    // Still contended after every retry: the device waits and sends the same ops again.
    if ((err as { statusCode?: number }).statusCode === 503) setResponseHeader(event, 'retry-after', 2)
    if (!(err instanceof SyncSeqGapError)) throw err
    // Nothing was applied; the device resends from expectedSeq.
    setResponseStatus(event, 409, 'Out of sequence')
    const info = { expectedSeq: err.expectedSeq, lastSeq: err.lastSeq }
    return { statusCode: 409, message: err.message, ...info, data: info }
  }
})
