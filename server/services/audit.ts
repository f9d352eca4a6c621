import type { Transaction } from 'sequelize'
import { AuditEntry } from '../db/models/index.ts'

export interface AuditInput {
  userId: number | null
  siteId: number | null
  action: string
  entity: string
  entityId: number | string | null
  before?: unknown
  after?: unknown
  requestId?: string | null
}

/** Append one entry to the audit log (inside the caller's transaction when given). */
export async function audit(e: AuditInput, transaction?: Transaction): Promise<void> {
  await AuditEntry.create(
    {
      userId: e.userId,
      siteId: e.siteId,
      action: e.action,
      entity: e.entity,
      entityId: e.entityId === null ? null : String(e.entityId),
      before: e.before ?? null,
      after: e.after ?? null,
      requestId: e.requestId ?? null,
    },
    { transaction },
  )
}

/** One page of a site's audit log, newest first. */
export async function listAudit(siteId: number, q: { page: number; pageSize: number }) {
  const { rows, count } = await AuditEntry.findAndCountAll({
    where: { siteId }, order: [['id', 'DESC']], limit: q.pageSize, offset: (q.page - 1) * q.pageSize,
  })
  return { items: rows.map((r) => r.get({ plain: true })), total: count, page: q.page, pageSize: q.pageSize }
}
