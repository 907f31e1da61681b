import type { Sequelize } from 'sequelize'
import { createSequelize, dbOptionsFromEnv } from '../../server/database/connect'

let db: Sequelize | null = null

/** A direct connection to the test database, for arranging and checking what the server wrote. */
export function testDb(): Sequelize {
  db ??= createSequelize(dbOptionsFromEnv())
  return db
}

export async function closeTestDb() {
  await db?.close()
  db = null
}
