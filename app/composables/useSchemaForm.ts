// One way for every form to check its input against a schema and show each error beside its field,
// linked to the input for screen readers (aria-invalid, aria-describedby). The schema is the
// payload's own (shared/schemas); the same error shape comes back from the server (400 with
// `data.fields`) and from the device when it refuses to queue an op (OpRefusedError.fields).
import type { z } from 'zod'

/** What a component showing some of a form's fields needs: its errors, their ids, the input attributes. */
export interface FormView {
  errorOf: (name: string) => string | undefined
  errorId: (name: string) => string
  attrs: (name: string, hintId?: string) => {
    'aria-invalid': 'true' | undefined
    'aria-describedby': string | undefined
    'class': string | undefined
  }
  /** The fields under one key (`newCustomer`), for a component that shows a nested object. */
  under: (prefix: string) => FormView
}

export interface SchemaForm<S extends z.ZodType = z.ZodType> extends FormView {
  /** Errors by field path (`spec.min`), `_` for the form as a whole. */
  errors: Record<string, string>
  busy: boolean
  /** Checks `input` against the form's schema (or another); the parsed value, or undefined with the errors shown. */
  check: <T extends z.ZodType = S>(input: unknown, schema?: T) => z.output<T> | undefined
  /** Shows what a failed save said: a server 400's fields, a refused op's fields, or one message. */
  fail: (err: unknown) => void
  /** Runs a save with `busy` set; a throw becomes errors beside the fields. Answers whether it worked. */
  save: (work: () => unknown) => Promise<boolean>
  clear: () => void
}

/**
 * @param idPrefix unique on the page; error elements get `${idPrefix}-${field}-error` ids.
 * @param rename wire field names shown under another form field (`{ unitPriceCents: 'unitPrice' }`; `''` drops the name).
 */
export function useSchemaForm<S extends z.ZodType>(schema: S, idPrefix: string, rename: Record<string, string> = {}): SchemaForm<S> {
  const errors = ref<Record<string, string>>({})
  const busy = ref(false)

  function show(fields: Record<string, string>) {
    errors.value = Object.fromEntries(Object.entries(fields).map(([k, v]) => [renamed(k), v]))
  }
  function renamed(path: string) {
    const head = path.split('.')[0]!
    if (!(head in rename)) return path
    // An empty name drops the head: a route's `definition.title` is the form's `title`.
    return rename[head] ? rename[head] + path.slice(head.length) : path.slice(head.length + 1) || '_'
  }

  function check<T extends z.ZodType = S>(input: unknown, other?: T): z.output<T> | undefined {
    const r = (other ?? schema).safeParse(input)
    if (r.success) {
      errors.value = {}
      return r.data as z.output<T>
    }
    show(fieldErrorsOf(r.error))
    return undefined
  }
  function fail(err: unknown) {
    show(errorFields(err))
  }
  async function save(work: () => unknown): Promise<boolean> {
    busy.value = true
    try {
      await work()
      return true
    }
    catch (err) {
      fail(err)
      return false
    }
    finally { busy.value = false }
  }
  /** The message for a field, or for the first of its sub-fields (`spec` shows `spec.min`'s). */
  function errorOf(name: string) {
    return errors.value[name] ?? Object.entries(errors.value).find(([k]) => k.startsWith(`${name}.`))?.[1]
  }
  const errorId = (name: string) => `${idPrefix}-${name.replace(/[^\w-]/g, '-')}-error`
  /** Bind on the input: `v-bind="form.attrs('partNumber')"`; `hintId` stays described while there is no error. */
  function attrs(name: string, hintId?: string) {
    const bad = !!errorOf(name)
    return {
      'aria-invalid': bad ? 'true' as const : undefined,
      'aria-describedby': bad ? errorId(name) : hintId,
      'class': bad ? 'field-error' : undefined,
    }
  }
  // Reactive, so templates read `form.busy` and `form.errors.x` without `.value`.
  const view = (prefix: string): FormView => ({
    errorOf: n => errorOf(prefix + n),
    errorId: n => errorId(prefix + n),
    attrs: (n, hint) => attrs(prefix + n, hint),
    under: p => view(`${prefix}${p}.`),
  })
  return reactive({
    errors,
    busy,
    check,
    fail,
    save,
    clear: () => {
      errors.value = {}
    },
    ...view(''),
  }) as SchemaForm<S>
}
