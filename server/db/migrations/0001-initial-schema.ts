import { DataTypes, type QueryInterface } from 'sequelize'

// The whole data model of the product, created up front so later features need no
// destructive change: identity and audit, cost bases, studies with runs/options/review,
// site components and vendor quotes, operating log, solvent allocations and mail.

const id = { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false }
// Millisecond timestamps: 'changed since you last looked' compares them.
const createdAt = { type: DataTypes.DATE(3), allowNull: false }
const updatedAt = { type: DataTypes.DATE(3), allowNull: false }
const fk = (table: string, onDelete: 'CASCADE' | 'RESTRICT' = 'CASCADE', allowNull = false) => ({
  type: DataTypes.INTEGER.UNSIGNED,
  allowNull,
  references: { model: table, key: 'id' },
  onDelete,
  onUpdate: 'CASCADE',
})
const longText = (allowNull = false) => ({ type: DataTypes.TEXT('long'), allowNull })
const opts = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' }

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('users', {
    id,
    email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
    name: { type: DataTypes.STRING(120), allowNull: false },
    password_hash: { type: DataTypes.STRING(100), allowNull: false },
    is_admin: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
    unit_system: { type: DataTypes.ENUM('SI', 'US'), allowNull: false, defaultValue: 'SI' },
    token_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    last_seen_at: { type: DataTypes.DATE, allowNull: true },
    created_at: createdAt,
    updated_at: updatedAt,
  }, opts)
  await qi.createTable('sites', {
    id,
    name: { type: DataTypes.STRING(160), allowNull: false },
    code: { type: DataTypes.STRING(40), allowNull: false, unique: true },
    description: { type: DataTypes.TEXT, allowNull: false },
    created_at: createdAt,
    updated_at: updatedAt,
  }, opts)
  await qi.createTable('memberships', {
    id,
    user_id: fk('users'),
    site_id: fk('sites'),
    role: { type: DataTypes.ENUM('admin', 'economist', 'engineer', 'reviewer'), allowNull: false },
    created_at: createdAt,
    updated_at: updatedAt,
  }, opts)
  await qi.addIndex('memberships', ['user_id', 'site_id'], { unique: true, name: 'memberships_user_site' })

  await qi.createTable('audit_log', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    at: { type: DataTypes.DATE(3), allowNull: false },
    user_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    site_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    action: { type: DataTypes.STRING(60), allowNull: false },
    entity: { type: DataTypes.STRING(60), allowNull: false },
    entity_id: { type: DataTypes.STRING(60), allowNull: true },
    before: longText(true),
    after: longText(true),
    request_id: { type: DataTypes.STRING(64), allowNull: true },
  }, opts)
  await qi.addIndex('audit_log', ['site_id', 'at'], { name: 'audit_site_at' })
  await qi.addIndex('audit_log', ['entity', 'entity_id'], { name: 'audit_entity' })

  await qi.createTable('cost_bases', {
    id,
    site_id: fk('sites'),
    version: { type: DataTypes.INTEGER, allowNull: false },
    status: { type: DataTypes.ENUM('draft', 'published'), allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false },
    data: longText(),
    effective_date: { type: DataTypes.DATEONLY, allowNull: true },
    published_at: { type: DataTypes.DATE, allowNull: true },
    published_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    based_on_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    lock_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: createdAt,
    updated_at: updatedAt,
  }, opts)
  await qi.addIndex('cost_bases', ['site_id', 'version'], { unique: true, name: 'cost_bases_site_version' })

  await qi.createTable('studies', {
    id,
    site_id: fk('sites'),
    owner_id: fk('users', 'RESTRICT'),
    name: { type: DataTypes.STRING(160), allowNull: false },
    description: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.ENUM('draft', 'in_review', 'approved', 'returned', 'archived'), allowNull: false, defaultValue: 'draft' },
    inputs: longText(),
    search: longText(true),
    revision: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 1 },
    parent_study_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    recommended_option_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    optimum_tac: { type: DataTypes.DOUBLE, allowNull: true },
    target_recovery: { type: DataTypes.DOUBLE, allowNull: true },
    last_run_at: { type: DataTypes.DATE, allowNull: true },
    lock_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: createdAt,
    updated_at: updatedAt,
  }, opts)
  await qi.addIndex('studies', ['site_id', 'status'], { name: 'studies_site_status' })

  await qi.createTable('runs', {
    id,
    study_id: fk('studies'),
    kind: { type: DataTypes.ENUM('design', 'optimize'), allowNull: false },
    inputs: longText(),
    search: longText(true),
    cost_basis_id: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true, references: { model: 'cost_bases', key: 'id' }, onDelete: 'RESTRICT' },
    cost_basis_version: { type: DataTypes.INTEGER, allowNull: true },
    engine_version: { type: DataTypes.STRING(40), allowNull: false },
    result: longText(),
    total_annual_cost: { type: DataTypes.DOUBLE, allowNull: true },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: createdAt,
  }, opts)
  await qi.addIndex('runs', ['study_id', 'created_at'], { name: 'runs_study_created' })

  await qi.createTable('study_options', {
    id,
    study_id: fk('studies'),
    run_id: fk('runs', 'RESTRICT'),
    name: { type: DataTypes.STRING(160), allowNull: false },
    notes: { type: DataTypes.TEXT, allowNull: false },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: createdAt,
  }, opts)

  await qi.createTable('review_events', {
    id,
    study_id: fk('studies'),
    user_id: fk('users', 'RESTRICT'),
    kind: { type: DataTypes.ENUM('comment', 'submit', 'approve', 'return', 'reopen'), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    created_at: createdAt,
  }, opts)

  await qi.createTable('study_views', {
    id,
    user_id: fk('users'),
    study_id: fk('studies'),
    seen_at: { type: DataTypes.DATE(3), allowNull: false },
  }, opts)
  await qi.addIndex('study_views', ['user_id', 'study_id'], { unique: true, name: 'study_views_user_study' })

  await qi.createTable('site_components', {
    id,
    site_id: fk('sites'),
    kind: { type: DataTypes.ENUM('component', 'equilibriumTable'), allowNull: false },
    name: { type: DataTypes.STRING(160), allowNull: false },
    data: longText(),
    source: { type: DataTypes.TEXT, allowNull: false },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: createdAt,
    updated_at: updatedAt,
  }, opts)

  await qi.createTable('vendor_quotes', {
    id,
    site_id: fk('sites'),
    equipment_type: { type: DataTypes.STRING(60), allowNull: false },
    size: { type: DataTypes.DOUBLE, allowNull: false },
    size_unit: { type: DataTypes.STRING(20), allowNull: false },
    cost: { type: DataTypes.DOUBLE, allowNull: false },
    currency: { type: DataTypes.STRING(3), allowNull: false },
    quote_date: { type: DataTypes.DATEONLY, allowNull: true },
    cost_index: { type: DataTypes.DOUBLE, allowNull: true },
    vendor: { type: DataTypes.STRING(160), allowNull: false },
    upload_ref: { type: DataTypes.STRING(64), allowNull: true },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: createdAt,
  }, opts)

  await qi.createTable('operating_entries', {
    id,
    study_id: fk('studies'),
    month: { type: DataTypes.DATEONLY, allowNull: false },
    gas_flow: { type: DataTypes.DOUBLE, allowNull: false },
    solvent_flow: { type: DataTypes.DOUBLE, allowNull: false },
    outlet_mole_fraction: { type: DataTypes.DOUBLE, allowNull: true },
    recovery: { type: DataTypes.DOUBLE, allowNull: true },
    power_kw: { type: DataTypes.DOUBLE, allowNull: true },
    notes: { type: DataTypes.TEXT, allowNull: false },
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    lock_version: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    created_at: createdAt,
    updated_at: updatedAt,
  }, opts)
  await qi.addIndex('operating_entries', ['study_id', 'month'], { unique: true, name: 'operating_study_month' })

  await qi.createTable('solvent_allocations', {
    id,
    site_id: fk('sites'),
    name: { type: DataTypes.STRING(160), allowNull: false },
    inputs: longText(),
    result: longText(true),
    created_by: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
    created_at: createdAt,
  }, opts)

  await qi.createTable('mail_messages', {
    id,
    to_address: { type: DataTypes.STRING(254), allowNull: false },
    subject: { type: DataTypes.STRING(250), allowNull: false },
    body: { type: DataTypes.TEXT, allowNull: false },
    status: { type: DataTypes.ENUM('pending', 'sent', 'failed'), allowNull: false, defaultValue: 'pending' },
    attempts: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
    last_error: { type: DataTypes.TEXT, allowNull: true },
    sent_at: { type: DataTypes.DATE, allowNull: true },
    created_at: createdAt,
    updated_at: updatedAt,
  }, opts)
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  for (const t of [
    'mail_messages', 'solvent_allocations', 'operating_entries', 'vendor_quotes', 'site_components',
    'study_views', 'review_events', 'study_options', 'runs', 'studies', 'cost_bases', 'audit_log',
    'memberships', 'sites', 'users',
  ]) {
    await qi.dropTable(t)
  }
}
