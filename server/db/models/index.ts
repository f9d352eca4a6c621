import {
  Model,
  DataTypes,
  type CreationOptional,
  type InferAttributes,
  type InferCreationAttributes,
  type ForeignKey,
} from 'sequelize'
import { sequelize, jsonColumn } from '../sequelize.ts'
import { ROLES, STUDY_STATUSES, type Role, type StudyStatus, type UnitSystem } from '../../../shared/schemas/common.ts'

// All models of the product, defined once. Table layout is owned by the migrations in
// ../migrations; these definitions must match them. Associations live in ../associations.ts.

const id = { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true } as const
const ts = { createdAt: DataTypes.DATE(3), updatedAt: DataTypes.DATE(3) } as const

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
  declare id: CreationOptional<number>
  declare email: string
  declare name: string
  declare passwordHash: string
  declare isAdmin: CreationOptional<boolean>
  declare unitSystem: CreationOptional<UnitSystem>
  declare tokenVersion: CreationOptional<number>
  declare lastSeenAt: Date | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}
User.init(
  {
    id,
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    passwordHash: { type: DataTypes.STRING(100), allowNull: false },
    isAdmin: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    unitSystem: { type: DataTypes.ENUM('SI', 'US'), allowNull: false, defaultValue: 'SI' },
    tokenVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    lastSeenAt: { type: DataTypes.DATE, allowNull: true },
    ...ts,
  },
  { sequelize, tableName: 'users' },
)

export class Site extends Model<InferAttributes<Site>, InferCreationAttributes<Site>> {
  declare id: CreationOptional<number>
  declare name: string
  declare code: string
  declare description: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}
Site.init(
  {
    id,
    name: { type: DataTypes.STRING(160), allowNull: false },
    code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    ...ts,
  },
  { sequelize, tableName: 'sites' },
)

export class Membership extends Model<InferAttributes<Membership>, InferCreationAttributes<Membership>> {
  declare id: CreationOptional<number>
  declare userId: ForeignKey<number>
  declare siteId: ForeignKey<number>
  declare role: Role
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}
Membership.init(
  { id, role: { type: DataTypes.ENUM(...ROLES), allowNull: false }, ...ts },
  { sequelize, tableName: 'memberships' },
)

/** Append-only: who did what, when, with the state before and after. */
export class AuditEntry extends Model<InferAttributes<AuditEntry>, InferCreationAttributes<AuditEntry>> {
  declare id: CreationOptional<number>
  declare at: CreationOptional<Date>
  declare userId: number | null
  declare siteId: number | null
  declare action: string
  declare entity: string
  declare entityId: string | null
  declare before: unknown
  declare after: unknown
  declare requestId: string | null
}
AuditEntry.init(
  {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    at: { type: DataTypes.DATE(3), allowNull: false, defaultValue: DataTypes.NOW },
    userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    siteId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    action: { type: DataTypes.STRING(60), allowNull: false },
    entity: { type: DataTypes.STRING(60), allowNull: false },
    entityId: { type: DataTypes.STRING(60), allowNull: true },
    before: jsonColumn('before', true),
    after: jsonColumn('after', true),
    requestId: { type: DataTypes.STRING(64), allowNull: true },
  },
  { sequelize, tableName: 'audit_log', timestamps: false },
)

/** Versioned cost basis of a site: drafts are editable, published versions are immutable. */
export class CostBasis extends Model<InferAttributes<CostBasis>, InferCreationAttributes<CostBasis>> {
  declare id: CreationOptional<number>
  declare siteId: ForeignKey<number>
  declare version: number
  declare status: 'draft' | 'published'
  declare name: string
  declare notes: CreationOptional<string>
  declare data: unknown
  declare effectiveDate: string | null
  declare publishedAt: Date | null
  declare publishedBy: number | null
  declare createdBy: number | null
  declare basedOnId: number | null
  declare lockVersion: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}
CostBasis.init(
  {
    id,
    version: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.ENUM('draft', 'published'), allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    data: jsonColumn('data'),
    effectiveDate: { type: DataTypes.DATEONLY, allowNull: true },
    publishedAt: { type: DataTypes.DATE, allowNull: true },
    publishedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    basedOnId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    lockVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    ...ts,
  },
  { sequelize, tableName: 'cost_bases' },
)

export class Study extends Model<InferAttributes<Study>, InferCreationAttributes<Study>> {
  declare id: CreationOptional<number>
  declare siteId: ForeignKey<number>
  declare ownerId: ForeignKey<number>
  declare name: string
  declare description: CreationOptional<string>
  declare status: CreationOptional<StudyStatus>
  declare inputs: unknown
  declare search: unknown
  declare revision: CreationOptional<number>
  declare parentStudyId: number | null
  declare recommendedOptionId: number | null
  declare optimumTac: number | null
  declare targetRecovery: number | null
  declare lastRunAt: Date | null
  declare lockVersion: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}
Study.init(
  {
    id,
    name: { type: DataTypes.STRING(160), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    status: { type: DataTypes.ENUM(...STUDY_STATUSES), allowNull: false, defaultValue: 'draft' },
    inputs: jsonColumn('inputs'),
    search: jsonColumn('search', true),
    revision: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    parentStudyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    recommendedOptionId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    optimumTac: { type: DataTypes.DOUBLE, allowNull: true },
    targetRecovery: { type: DataTypes.DOUBLE, allowNull: true },
    lastRunAt: { type: DataTypes.DATE, allowNull: true },
    lockVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    ...ts,
  },
  { sequelize, tableName: 'studies' },
)

/** A stored evaluation: exact inputs, cost-basis version, engine version and full result. */
export class Run extends Model<InferAttributes<Run>, InferCreationAttributes<Run>> {
  declare id: CreationOptional<number>
  declare studyId: ForeignKey<number>
  declare kind: 'design' | 'optimize'
  declare inputs: unknown
  declare search: unknown
  declare costBasisId: number | null
  declare costBasisVersion: number | null
  declare engineVersion: string
  declare result: unknown
  declare totalAnnualCost: number | null
  declare createdBy: number | null
  declare createdAt: CreationOptional<Date>
}
Run.init(
  {
    id,
    kind: { type: DataTypes.ENUM('design', 'optimize'), allowNull: false },
    inputs: jsonColumn('inputs'),
    search: jsonColumn('search', true),
    costBasisId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    costBasisVersion: { type: DataTypes.INTEGER, allowNull: true },
    engineVersion: { type: DataTypes.STRING(40), allowNull: false },
    result: jsonColumn('result'),
    totalAnnualCost: { type: DataTypes.DOUBLE, allowNull: true },
    createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    createdAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'runs', updatedAt: false },
)

/** A design pinned within a study under a name, for comparison and recommendation. */
export class StudyOption extends Model<InferAttributes<StudyOption>, InferCreationAttributes<StudyOption>> {
  declare id: CreationOptional<number>
  declare studyId: ForeignKey<number>
  declare runId: number
  declare name: string
  declare notes: CreationOptional<string>
  declare createdBy: number | null
  declare createdAt: CreationOptional<Date>
}
StudyOption.init(
  {
    id,
    runId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    createdAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'study_options', updatedAt: false },
)

/** Review thread: comments and state changes (submit, approve, return). */
export class ReviewEvent extends Model<InferAttributes<ReviewEvent>, InferCreationAttributes<ReviewEvent>> {
  declare id: CreationOptional<number>
  declare studyId: ForeignKey<number>
  declare userId: number
  declare kind: 'comment' | 'submit' | 'approve' | 'return' | 'reopen'
  declare body: CreationOptional<string>
  declare createdAt: CreationOptional<Date>
}
ReviewEvent.init(
  {
    id,
    userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    kind: { type: DataTypes.ENUM('comment', 'submit', 'approve', 'return', 'reopen'), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'review_events', updatedAt: false },
)

/** When a person last looked at a study (for "what changed since" notifications). */
export class StudyView extends Model<InferAttributes<StudyView>, InferCreationAttributes<StudyView>> {
  declare id: CreationOptional<number>
  declare userId: number
  declare studyId: number
  declare seenAt: Date
}
StudyView.init(
  {
    id,
    userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    studyId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
    seenAt: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'study_views', timestamps: false },
)

/** Site-specific components and uploaded equilibrium data sets. */
export class SiteComponent extends Model<InferAttributes<SiteComponent>, InferCreationAttributes<SiteComponent>> {
  declare id: CreationOptional<number>
  declare siteId: ForeignKey<number>
  declare kind: 'component' | 'equilibriumTable'
  declare name: string
  declare data: unknown
  declare source: CreationOptional<string>
  declare createdBy: number | null
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}
SiteComponent.init(
  {
    id,
    kind: { type: DataTypes.ENUM('component', 'equilibriumTable'), allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false },
    data: jsonColumn('data'),
    source: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    ...ts,
  },
  { sequelize, tableName: 'site_components' },
)

export class VendorQuote extends Model<InferAttributes<VendorQuote>, InferCreationAttributes<VendorQuote>> {
  declare id: CreationOptional<number>
  declare siteId: ForeignKey<number>
  declare equipmentType: string
  declare size: number
  declare sizeUnit: string
  declare cost: number
  declare currency: string
  declare quoteDate: string | null
  declare costIndex: number | null
  declare vendor: CreationOptional<string>
  declare uploadRef: string | null
  declare createdBy: number | null
  declare createdAt: CreationOptional<Date>
}
VendorQuote.init(
  {
    id,
    equipmentType: { type: DataTypes.STRING(60), allowNull: false },
    size: { type: DataTypes.DOUBLE, allowNull: false },
    sizeUnit: { type: DataTypes.STRING(20), allowNull: false },
    cost: { type: DataTypes.DOUBLE, allowNull: false },
    currency: { type: DataTypes.STRING(3), allowNull: false },
    quoteDate: { type: DataTypes.DATEONLY, allowNull: true },
    costIndex: { type: DataTypes.DOUBLE, allowNull: true },
    vendor: { type: DataTypes.STRING(160), allowNull: false, defaultValue: '' },
    uploadRef: { type: DataTypes.STRING(64), allowNull: true },
    createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    createdAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'vendor_quotes', updatedAt: false },
)

/** Monthly operating data of an approved study's running unit. */
export class OperatingEntry extends Model<InferAttributes<OperatingEntry>, InferCreationAttributes<OperatingEntry>> {
  declare id: CreationOptional<number>
  declare studyId: ForeignKey<number>
  declare month: string
  declare gasFlow: number
  declare solventFlow: number
  declare inletMoleFraction: CreationOptional<number | null>
  declare outletMoleFraction: number | null
  declare recovery: number | null
  declare powerKw: number | null
  declare notes: CreationOptional<string>
  declare createdBy: number | null
  declare lockVersion: CreationOptional<number>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}
OperatingEntry.init(
  {
    id,
    month: { type: DataTypes.DATEONLY, allowNull: false },
    gasFlow: { type: DataTypes.DOUBLE, allowNull: false },
    solventFlow: { type: DataTypes.DOUBLE, allowNull: false },
    inletMoleFraction: { type: DataTypes.DOUBLE, allowNull: true },
    outletMoleFraction: { type: DataTypes.DOUBLE, allowNull: true },
    recovery: { type: DataTypes.DOUBLE, allowNull: true },
    powerKw: { type: DataTypes.DOUBLE, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: false, defaultValue: '' },
    createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    lockVersion: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    ...ts,
  },
  { sequelize, tableName: 'operating_entries' },
)

/** A saved site solvent allocation: chosen absorbers, supply limit and the LP's answer. */
export class SolventAllocation extends Model<InferAttributes<SolventAllocation>, InferCreationAttributes<SolventAllocation>> {
  declare id: CreationOptional<number>
  declare siteId: ForeignKey<number>
  declare name: string
  declare inputs: unknown
  declare result: unknown
  declare createdBy: number | null
  declare createdAt: CreationOptional<Date>
}
SolventAllocation.init(
  {
    id,
    name: { type: DataTypes.STRING(160), allowNull: false },
    inputs: jsonColumn('inputs'),
    result: jsonColumn('result', true),
    createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    createdAt: DataTypes.DATE(3),
  },
  { sequelize, tableName: 'solvent_allocations', updatedAt: false },
)

/** Outgoing e-mail, kept so that sending can be retried and (in development) shown. */
export class MailMessage extends Model<InferAttributes<MailMessage>, InferCreationAttributes<MailMessage>> {
  declare id: CreationOptional<number>
  declare toAddress: string
  declare subject: string
  declare body: string
  declare status: CreationOptional<'pending' | 'sent' | 'failed'>
  declare attempts: CreationOptional<number>
  declare lastError: string | null
  declare sentAt: Date | null
  /** A sender's lease: until then no other sender takes the message. */
  declare claimedUntil: CreationOptional<Date | null>
  declare createdAt: CreationOptional<Date>
  declare updatedAt: CreationOptional<Date>
}
MailMessage.init(
  {
    id,
    toAddress: { type: DataTypes.STRING(254), allowNull: false },
    subject: { type: DataTypes.STRING(250), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.ENUM('pending', 'sent', 'failed'), allowNull: false, defaultValue: 'pending' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    lastError: { type: DataTypes.TEXT, allowNull: true },
    sentAt: { type: DataTypes.DATE, allowNull: true },
    claimedUntil: { type: DataTypes.DATE(3), allowNull: true },
    ...ts,
  },
  { sequelize, tableName: 'mail_messages' },
)

/** A failed sign-in, per account (e-mail as typed) and per client address: the shared throttle. */
export class SignInFailure extends Model<InferAttributes<SignInFailure>, InferCreationAttributes<SignInFailure>> {
  declare id: CreationOptional<number>
  declare scope: 'account' | 'address'
  declare subject: string
  declare failedAt: Date
}
SignInFailure.init(
  {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
    scope: { type: DataTypes.ENUM('account', 'address'), allowNull: false },
    subject: { type: DataTypes.STRING(254), allowNull: false },
    failedAt: { type: DataTypes.DATE(3), allowNull: false },
  },
  { sequelize, tableName: 'sign_in_failures', timestamps: false },
)
