// The device checks every op against the protocol's own schema before it is queued, so the phone
// never queues what the server would refuse for its shape (and the mechanic hears it while the
// driver is still there, beside the field, not later in the sync panel).
import { conflictResolutionSchema, createSchemas, updateSchemas } from '#shared/schemas/sync'
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
  if (entity === 'conflictResolution') return action === 'create' ? conflictResolutionSchema : undefined
  const table: Record<string, z.ZodType> = action === 'create' ? createSchemas : updateSchemas
  return table[entity]
}

/** The op's changes as the server will read them (codes normalised); throws OpRefusedError. */
export function checkOp(entity: string, action: 'create' | 'update', changes: Record<string, unknown>): Record<string, unknown> {
  const schema = schemaOf(entity, action)
  if (!schema) throw new OpRefusedError({ _: `A ${entity} cannot be ${action === 'create' ? 'added' : 'changed'} from the phone` })
  const r = schema.safeParse(changes)
  if (!r.success) throw new OpRefusedError(fieldErrorsOf(r.error))
  return r.data as Record<string, unknown>
}
