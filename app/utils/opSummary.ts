// Plain words for an outbox op and for a conflicting field, for the sync panel and the call page:
// the registry's own (shared/sync/entities.ts), so a new entity brings its words with it.
import { isSyncEntity, summarizeOp, SYNC_ENTITIES } from '#shared/sync/entities'
import type { Op } from './fieldDb'

/** A record field in words ('storyCause' → 'cause'); the call's fields unless another entity is named. */
export function fieldWords(field: string, entity = 'call'): string {
  const def = isSyncEntity(entity) ? SYNC_ENTITIES[entity] : undefined
  const words: Readonly<Record<string, string>> | undefined = def && 'fieldWords' in def ? def.fieldWords : undefined
  return words?.[field] ?? field
}

export function opSummary(op: Pick<Op, 'entity' | 'action' | 'changes'>): string {
  return summarizeOp(op)
}
