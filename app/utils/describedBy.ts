/**
 * The `aria-describedby` of an input: the ids of the texts shown beside it (its hint, its error),
 * leaving out those not on the screen. `describedBy(error && `${id}-error`, hint && `${id}-hint`)`.
 */
export function describedBy(...ids: (string | false | null | undefined)[]): string | undefined {
  const shown = ids.filter((x): x is string => !!x)
  return shown.length ? shown.join(' ') : undefined
}
