import { sequelize } from './sequelize.ts'
import { migrate } from './migrator.ts'
import { associate } from './associations.ts'
import { seedDemo, DEMO_PASSWORD, DEMO_PEOPLE } from './seeders/demo.ts'

/** Database tasks for scripts: migrate | seed | demo-password | demo-users */
async function main(cmd: string | undefined): Promise<void> {
  if (cmd === 'demo-password') return void console.log(DEMO_PASSWORD)
  if (cmd === 'demo-users') {
    for (const p of DEMO_PEOPLE) {
      const roles = Object.entries(p.roles).map(([s, r]) => `${r} at ${s}`).join(', ')
      console.log(`    ${p.email.padEnd(30)} ${p.isAdmin ? 'system admin; ' : ''}${roles}`)
    }
    return
  }
  associate()
  try {
    if (cmd === 'migrate') {
      const done = await migrate(sequelize)
      console.log(`[scrubwright] migrations: ${done.length ? done.join(', ') : 'up to date'}`)
    } else if (cmd === 'seed') {
      const { created } = await seedDemo(sequelize)
      console.log(`[scrubwright] demo data: ${created ? `${created} rows created` : 'already present'}`)
    } else {
      console.error('usage: tsx server/db/cli.ts migrate|seed|demo-password|demo-users')
      process.exitCode = 2
    }
  } finally {
    await sequelize.close()
  }
}

main(process.argv[2]).catch((err: unknown) => {
  console.error(err instanceof Error ? err.message : err)
  process.exit(1)
})
