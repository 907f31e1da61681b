// Which failures count as "the database is not there": real errors from Sequelize, the driver and sockets.
import { createServer } from 'node:net'
import { Sequelize } from 'sequelize'
import * as mariadb from 'mariadb'
import { afterAll, describe, expect, it } from 'vitest'
import { databaseFailure, databaseOutageMessage } from '../../server/utils/db-outage'

async function closedPort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const port = (s.address() as { port: number }).port
      s.close(() => resolve(port))
    })
  })
}

const port = await closedPort()
const sequelize = new Sequelize('perpend', 'perpend', 'x', {
  host: '127.0.0.1', port, dialect: 'mariadb', dialectModule: mariadb, logging: false,
  pool: { max: 1, acquire: 2_000 }, dialectOptions: { connectTimeout: 1_000 },
})
afterAll(() => sequelize.close())

const caught = (p: Promise<unknown>) => p.then(() => { throw new Error('expected a failure') }, (e: unknown) => e)

describe('databaseFailure', () => {
  it('recognises a refused connection, as Sequelize reports it and as h3 wraps it', async () => {
    const error = await caught(sequelize.query('SELECT 1'))
    expect((error as Error).name).toBe('SequelizeConnectionRefusedError')
    expect(databaseFailure(error)).toBe('unreachable')
    expect(databaseFailure(new Error('wrapped', { cause: error }))).toBe('unreachable')
  })

  it('recognises the driver\'s own refused connection', async () => {
    const error = await caught(mariadb.createConnection({ host: '127.0.0.1', port, user: 'x', connectTimeout: 1_000 }))
    expect((error as { code: string }).code).toBe('ECONNREFUSED')
    expect(databaseFailure(error)).toBe('unreachable')
  })

  it('leaves a refused connection to something else, and ordinary errors, alone', async () => {
    const other = await caught(fetch(`http://127.0.0.1:${port}/`))
    expect(databaseFailure(other)).toBeNull()
    expect(databaseFailure(new TypeError('x is not a function'))).toBeNull()
    expect(databaseFailure(Object.assign(new Error('Duplicate entry'), { name: 'SequelizeUniqueConstraintError' }))).toBeNull()
  })

  it('says nothing was saved only for writes', () => {
    expect(databaseOutageMessage('GET')).toBe('The database is not reachable just now. Try again in a minute.')
    expect(databaseOutageMessage('POST')).toBe('The database is not reachable just now; nothing was saved. Try again in a minute.')
    expect(databaseOutageMessage('PATCH', 'timeout')).toBe('The database did not answer in time; nothing was saved. Try again in a minute.')
  })
})
