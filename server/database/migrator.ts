import type { QueryInterface, Sequelize } from 'sequelize'
import { SequelizeStorage, Umzug } from 'umzug'
import { migrations } from '../migrations'

export type MigrationContext = QueryInterface

/** Umzug over the project's migration list; the applied names are kept in the `SequelizeMeta` table. */
export function createMigrator(sequelize: Sequelize) {
  return new Umzug<MigrationContext>({
    migrations: migrations.map(m => ({
      name: m.name,
      up: ({ context }) => m.up(context, sequelize),
      down: ({ context }) => m.down(context, sequelize),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  })
}

/** Names of migrations that exist in code but are not applied to the database. */
export async function pendingMigrations(sequelize: Sequelize): Promise<string[]> {
  const pending = await createMigrator(sequelize).pending()
  return pending.map(m => m.name)
}
