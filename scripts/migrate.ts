// Applies every pending migration to the database named by the NUXT_DB_* variables.
import { createSequelize, dbOptionsFromEnv } from '../server/database/connect'
import { createMigrator } from '../server/database/migrator'

const sequelize = createSequelize(dbOptionsFromEnv())
try {
  const applied = await createMigrator(sequelize).up()
  console.log(applied.length ? `Applied ${applied.length} migration(s): ${applied.map(m => m.name).join(', ')}` : 'Database schema is current')
}
finally {
  await sequelize.close()
}
