import * as mariadb from 'mariadb'
import { Sequelize } from 'sequelize'

export interface DbOptions {
  host: string
  port: number
  name: string
  user: string
  password: string
}

/**
 * One Sequelize instance for the given database.
 * `dialectModule` is passed explicitly: Sequelize loads its driver with a dynamic require that Nitro
 * cannot trace, so without it the built server would ship without `mariadb`.
 */
export function createSequelize(options: DbOptions): Sequelize {
  return new Sequelize(options.name, options.user, options.password, {
    host: options.host,
    port: Number(options.port),
    dialect: 'mariadb',
    dialectModule: mariadb,
    logging: false,
    timezone: '+00:00',
    pool: { max: 20, min: 0, idle: 10_000, acquire: 5_000 },
    dialectOptions: { connectTimeout: 3_000 },
    define: { underscored: true },
  })
}

/** Options from the same NUXT_DB_* variables the built server reads; used by the command-line scripts. */
export function dbOptionsFromEnv(env: NodeJS.ProcessEnv = process.env): DbOptions {
  return {
    host: env.NUXT_DB_HOST || '127.0.0.1',
    port: Number(env.NUXT_DB_PORT || 3307),
    name: env.NUXT_DB_NAME || 'perpend',
    user: env.NUXT_DB_USER || 'perpend',
    password: env.NUXT_DB_PASSWORD || 'perpend-local',
  }
}
