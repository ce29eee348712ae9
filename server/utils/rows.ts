/** A row as answered to clients: the change counter is sync machinery, not data. */
export function withoutXid<T extends object>(row: T): Omit<T, 'changeXid'> {
  const { changeXid: _xid, ...rest } = row as T & { changeXid?: unknown }
  return rest
}
