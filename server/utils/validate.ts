import type { z } from 'zod'

/** Thrown by validators so h3's 400 answer carries `data.fields` naming each bad field. */
class InputError extends Error {
  fields: Record<string, string>
  constructor(fields: Record<string, string>) {
    super(describeFieldErrors(fields))
    this.fields = fields
  }

  toJSON() { return { fields: this.fields } }
}

/** A validator for readValidatedBody / getValidatedQuery / getValidatedRouterParams. */
export function validateWith<S extends z.ZodType>(schema: S) {
  return (input: unknown): z.output<S> => {
    const parsed = schema.safeParse(input)
    if (!parsed.success) throw new InputError(fieldErrorsOf(parsed.error))
    return parsed.data
  }
}

/** 422: well-formed input that breaks a rule; names the field like a 400 does. */
export function ruleError(field: string, message: string): never {
  throw createError({ status: 422, statusText: 'Unprocessable', message: `${field}: ${message}`, data: { fields: { [field]: message } } })
}
