import bcrypt from 'bcryptjs'
import type { Sequelize } from 'sequelize'
import { User, Site, Membership, AuditEntry } from '../models/index.ts'
import type { Role } from '../../../shared/schemas/common.ts'
import { seedDemoStudies } from './demo-studies.ts'

/**
 * The invented demo scenario: Halvard Process Holdings with two sites and one person per role.
 * Idempotent: running it again changes nothing that already exists.
 */
export const DEMO_PASSWORD = 'scrubwright-demo'

export const DEMO_SITES = [
  {
    code: 'cobalt-ridge',
    name: 'Cobalt Ridge fermentation plant',
    description: 'Ethanol recovered from fermenter carbon dioxide into water before the vent.',
  },
  {
    code: 'marrow-bay',
    name: 'Marrow Bay coatings plant',
    description: 'Acetone scrubbed from dryer exhaust air into water.',
  },
] as const

export const DEMO_PEOPLE: { email: string; name: string; isAdmin: boolean; roles: Partial<Record<string, Role>> }[] = [
  { email: 'admin@halvard.example', name: 'Ada Lindqvist', isAdmin: true, roles: { 'cobalt-ridge': 'admin', 'marrow-bay': 'admin' } },
  { email: 'economist@halvard.example', name: 'Emil Okafor', isAdmin: false, roles: { 'cobalt-ridge': 'economist', 'marrow-bay': 'economist' } },
  { email: 'engineer@halvard.example', name: 'Nora Castellanos', isAdmin: false, roles: { 'cobalt-ridge': 'engineer', 'marrow-bay': 'engineer' } },
  { email: 'reviewer@halvard.example', name: 'Ravi Brandt', isAdmin: false, roles: { 'cobalt-ridge': 'reviewer', 'marrow-bay': 'reviewer' } },
  { email: 'bay.engineer@halvard.example', name: 'Tomas Welle', isAdmin: false, roles: { 'marrow-bay': 'engineer' } },
]

export async function seedDemo(sequelize: Sequelize): Promise<{ created: number }> {
  let created = 0
  const hash = await bcrypt.hash(DEMO_PASSWORD, 10)
  await sequelize.transaction(async (transaction) => {
    const sites = new Map<string, Site>()
    for (const s of DEMO_SITES) {
      const [site, made] = await Site.findOrCreate({ where: { code: s.code }, defaults: { ...s }, transaction })
      if (made) created++
      sites.set(s.code, site)
    }
    for (const p of DEMO_PEOPLE) {
      const [user, made] = await User.findOrCreate({
        where: { email: p.email },
        defaults: { email: p.email, name: p.name, passwordHash: hash, isAdmin: p.isAdmin, lastSeenAt: null },
        transaction,
      })
      if (made) created++
      for (const [code, role] of Object.entries(p.roles)) {
        const site = sites.get(code)
        if (!site || !role) continue
        const [, m] = await Membership.findOrCreate({
          where: { userId: user.id, siteId: site.id },
          defaults: { userId: user.id, siteId: site.id, role },
          transaction,
        })
        if (m) created++
      }
    }
    if (created > 0) {
      await AuditEntry.create(
        { userId: null, siteId: null, action: 'seed', entity: 'demo', entityId: null, before: null, after: { created }, requestId: null },
        { transaction },
      )
    }
    created += await seedDemoStudies(sites, transaction)
  })
  return { created }
}
