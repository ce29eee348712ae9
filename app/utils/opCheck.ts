// The device checks every op against its entity's schema in the registry (shared/sync/entities.ts)
// before it is queued, so the phone never queues what the server would refuse for its shape (and
// the mechanic hears it while the driver is still there, beside the field, not later in the sync
// panel). The server's first stage checks the same schemas again.
import { isSyncEntity, SYNC_ENTITIES } from '#shared/sync/entities'
import { describeFieldErrors, fieldErrorsOf } from '#shared/utils/fieldErrors'
import type { z } from 'zod'

/** An op the device would not queue; `fields` names each bad field as a form shows it. */
export class OpRefusedError extends Error {
  constructor(readonly fields: Record<string, string>) {
    super(describeFieldErrors(fields))
    this.name = 'OpRefusedError'
  }
}

function schemaOf(entity: string, action: 'create' | 'update'): z.ZodType | undefined {
  if (!isSyncEntity(entity)) return undefined
  const def = SYNC_ENTITIES[entity]
  if (def.kind === 'command') return action === 'create' ? def.command : undefined
  if (action === 'update') return 'update' in def ? def.update : undefined
  return def.kind === 'record' ? def.create : undefined
}

/** The op's changes as the server will read them (codes normalised); throws OpRefusedError. */
export function checkOp(entity: string, action: 'create' | 'update', changes: Record<string, unknown>): Record<string, unknown> {
  const schema = schemaOf(entity, action)
  if (!schema) {
    const word = isSyncEntity(entity) ? SYNC_ENTITIES[entity].words.one : entity
    throw new OpRefusedError({ _: `A ${word} cannot be ${action === 'create' ? 'added' : 'changed'} from the phone` })
  }
  const r = schema.safeParse(changes)
  if (!r.success) throw new OpRefusedError(fieldErrorsOf(r.error))
  return r.data as Record<string, unknown>
}
