import { Umzug, SequelizeStorage } from 'umzug'
import type { Sequelize } from 'sequelize'
import * as m0001 from './migrations/0001-initial-schema.ts'
import * as m0002 from './migrations/0002-shared-throttle-and-mail-lease.ts'
import * as m0003 from './migrations/0003-operating-inlet.ts'

/** Migrations are listed here in order; each exports up/down taking the QueryInterface. */
const MIGRATIONS = [
  { name: '0001-initial-schema', module: m0001 },
  { name: '0002-shared-throttle-and-mail-lease', module: m0002 },
  { name: '0003-operating-inlet', module: m0003 },
]

export function createMigrator(sequelize: Sequelize) {
  const qi = sequelize.getQueryInterface()
  return new Umzug({
    migrations: MIGRATIONS.map(({ name, module }) => ({
      name,
      up: () => module.up({ context: qi }),
      down: () => module.down({ context: qi }),
    })),
    context: qi,
    storage: new SequelizeStorage({ sequelize, tableName: 'schema_migrations' }),
    logger: undefined,
  })
}

export async function migrate(sequelize: Sequelize): Promise<string[]> {
  const done = await createMigrator(sequelize).up()
  return done.map((m) => m.name)
}
