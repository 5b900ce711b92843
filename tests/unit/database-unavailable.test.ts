// Which errors mean "the database is away, try again" (503) rather than a fault to report (500).
// SQLSTATE codes from PostgreSQL's documentation, Appendix A "PostgreSQL Error Codes";
// socket error codes as Node.js names them (errno, common practice).
import { describe, expect, it } from 'vitest'
import { isDatabaseUnavailable } from '../../server/db/connect'

const pgError = (code: string, message = 'x') => Object.assign(new Error(message), { code })

describe('isDatabaseUnavailable', () => {
  it('knows a server shutting down, crashed, starting up or full', () => {
    expect(isDatabaseUnavailable(pgError('57P01', 'terminating connection due to administrator command'))).toBe(true)
    expect(isDatabaseUnavailable(pgError('57P02'))).toBe(true)
    expect(isDatabaseUnavailable(pgError('57P03', 'the database system is starting up'))).toBe(true)
    expect(isDatabaseUnavailable(pgError('53300', 'sorry, too many clients already'))).toBe(true)
    expect(isDatabaseUnavailable(pgError('08006'))).toBe(true)
  })

  it('knows a refused or dropped connection, also inside an error that wraps it', () => {
    expect(isDatabaseUnavailable(pgError('ECONNREFUSED'))).toBe(true)
    expect(isDatabaseUnavailable(new AggregateError([pgError('ECONNREFUSED'), pgError('ECONNREFUSED')]))).toBe(true)
    expect(isDatabaseUnavailable(new Error('Connection terminated unexpectedly'))).toBe(true)
    expect(isDatabaseUnavailable(new Error('timeout exceeded when trying to connect'))).toBe(true)
    // h3 wraps what a route throws; the cause is the driver's error.
    expect(isDatabaseUnavailable(Object.assign(new Error('wrapped'), { cause: pgError('57P01') }))).toBe(true)
  })

  it('leaves a bad query, a broken constraint or a plain bug as they are', () => {
    expect(isDatabaseUnavailable(pgError('42601', 'syntax error at or near "selec"'))).toBe(false)
    expect(isDatabaseUnavailable(pgError('23505', 'duplicate key value violates unique constraint'))).toBe(false)
    expect(isDatabaseUnavailable(pgError('40P01', 'deadlock detected'))).toBe(false)
    expect(isDatabaseUnavailable(new TypeError('Cannot read properties of undefined'))).toBe(false)
    expect(isDatabaseUnavailable(undefined)).toBe(false)
  })
})
