import { createSequelize } from '../../server/db/sequelize.ts'
import { migrate } from '../../server/db/migrator.ts'

/** Bring the throw-away API test database to the current schema and seed the demo data once. */
export default async function setup(): Promise<void> {
  if (!process.env.DATABASE_URL) throw new Error('API tests need DATABASE_URL: run them with `npm run test:api`.')
  const sequelize = createSequelize(process.env.DATABASE_URL)
  try {
    await migrate(sequelize)
  } finally {
    await sequelize.close()
  }
  // The seeder uses the app's shared connection; import it after migrations.
  const { sequelize: appDb } = await import('../../server/db/sequelize.ts')
  const { associate } = await import('../../server/db/associations.ts')
  const { seedDemo } = await import('../../server/db/seeders/demo.ts')
  associate()
  await seedDemo(appDb)
  await appDb.close()
}
