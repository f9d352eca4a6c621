import {
  User, Site, Membership, CostBasis, Study, Run, StudyOption, ReviewEvent,
  SiteComponent, VendorQuote, OperatingEntry, SolventAllocation,
} from './models/index.ts'

let done = false
/** Every association of the product, in one place. Idempotent. */
export function associate(): void {
  if (done) return
  done = true
  User.hasMany(Membership, { foreignKey: 'userId', as: 'memberships' })
  Membership.belongsTo(User, { foreignKey: 'userId', as: 'user' })
  Site.hasMany(Membership, { foreignKey: 'siteId', as: 'memberships' })
  Membership.belongsTo(Site, { foreignKey: 'siteId', as: 'site' })

  Site.hasMany(CostBasis, { foreignKey: 'siteId' })
  CostBasis.belongsTo(Site, { foreignKey: 'siteId' })

  Site.hasMany(Study, { foreignKey: 'siteId' })
  Study.belongsTo(Site, { foreignKey: 'siteId' })
  Study.belongsTo(User, { foreignKey: 'ownerId', as: 'owner' })
  Study.hasMany(Run, { foreignKey: 'studyId', as: 'runs' })
  Run.belongsTo(Study, { foreignKey: 'studyId' })
  Study.hasMany(StudyOption, { foreignKey: 'studyId', as: 'options' })
  StudyOption.belongsTo(Study, { foreignKey: 'studyId' })
  StudyOption.belongsTo(Run, { foreignKey: 'runId', as: 'run' })
  Study.hasMany(ReviewEvent, { foreignKey: 'studyId', as: 'reviewEvents' })
  ReviewEvent.belongsTo(User, { foreignKey: 'userId', as: 'user' })
  Study.hasMany(OperatingEntry, { foreignKey: 'studyId', as: 'operatingEntries' })

  Site.hasMany(SiteComponent, { foreignKey: 'siteId' })
  Site.hasMany(VendorQuote, { foreignKey: 'siteId' })
  Site.hasMany(SolventAllocation, { foreignKey: 'siteId' })
  SiteComponent.belongsTo(Site, { foreignKey: 'siteId' })
  VendorQuote.belongsTo(Site, { foreignKey: 'siteId' })
  SolventAllocation.belongsTo(Site, { foreignKey: 'siteId' })
}
