import { describe, expect, it } from 'vitest'
import { isUnavailable } from '../../server/error'

const pgError = (code: string, message = 'x') => Object.assign(new Error(message), { code })

describe('a database that does not answer', () => {
  it('is told from the error codes PostgreSQL documents (Appendix A, error codes) and from refused connections', () => {
    expect(isUnavailable(pgError('57P01', 'terminating connection due to administrator command'))).toBe(true) // admin_shutdown
    expect(isUnavailable(pgError('57P03', 'the database system is starting up'))).toBe(true) // cannot_connect_now
    expect(isUnavailable(pgError('08006'))).toBe(true) // connection_failure
    expect(isUnavailable(pgError('53300'))).toBe(true) // too_many_connections
    expect(isUnavailable(pgError('ECONNREFUSED', 'connect ECONNREFUSED 127.0.0.1:5432'))).toBe(true)
    expect(isUnavailable(new Error('Connection terminated unexpectedly'))).toBe(true)
  })

  it('is found through wrapping errors (h3 and drizzle keep the cause)', () => {
    const wrapped = Object.assign(new Error('Failed query: select 1'), { cause: pgError('57P01') })
    expect(isUnavailable(Object.assign(new Error('wrapped'), { cause: wrapped }))).toBe(true)
  })

  it('is not a bad query or bad input', () => {
    expect(isUnavailable(pgError('23505', 'duplicate key value'))).toBe(false) // unique_violation
    expect(isUnavailable(pgError('22P05', 'unsupported Unicode escape sequence'))).toBe(false) // untranslatable_character
    expect(isUnavailable(new Error('Cannot read properties of undefined'))).toBe(false)
  })
})
