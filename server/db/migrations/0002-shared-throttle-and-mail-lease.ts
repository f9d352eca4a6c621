import { DataTypes, type QueryInterface } from 'sequelize'

// State that every server process must share lives in the database:
// - sign_in_failures: failed sign-ins per account and per client address, for the throttle;
// - mail_messages.claimed_until: a sender's lease on a queued message, so that with several
//   replicas exactly one of them delivers it.

const opts = { charset: 'utf8mb4', collate: 'utf8mb4_unicode_ci', engine: 'InnoDB' }

export async function up({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.createTable('sign_in_failures', {
    id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true, allowNull: false },
    scope: { type: DataTypes.ENUM('account', 'address'), allowNull: false },
    subject: { type: DataTypes.STRING(254), allowNull: false },
    failed_at: { type: DataTypes.DATE(3), allowNull: false },
  }, opts)
  await qi.addIndex('sign_in_failures', ['scope', 'subject', 'failed_at'], { name: 'sign_in_failures_lookup' })
  await qi.addIndex('sign_in_failures', ['failed_at'], { name: 'sign_in_failures_age' })
  await qi.addColumn('mail_messages', 'claimed_until', { type: DataTypes.DATE(3), allowNull: true })
  await qi.addIndex('mail_messages', ['status', 'id'], { name: 'mail_messages_due' })
}

export async function down({ context: qi }: { context: QueryInterface }): Promise<void> {
  await qi.removeIndex('mail_messages', 'mail_messages_due')
  await qi.removeColumn('mail_messages', 'claimed_until')
  await qi.dropTable('sign_in_failures')
}
