import type { Sequelize } from 'sequelize'
import { createSequelize } from '../database/connect'
import { initModels } from '../models'

let sequelize: Sequelize | null = null

/** The one database connection of this server process, built on first use from the runtime config. */
export function useDb(): Sequelize {
  if (!sequelize) {
    const { db } = useRuntimeConfig()
    sequelize = createSequelize({ host: db.host, port: Number(db.port), name: db.name, user: db.user, password: db.password })
    initModels(sequelize)
  }
  return sequelize
}
