import { describe, it, expect, beforeAll, afterAll } from 'vitest'
import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import path from 'node:path'
import { PrivateMariaDb, migrateAndSeed, DB_PORT } from './processes.ts'

/**
 * `npm run db:backup` then `npm run db:restore -- FILE` into a fresh, empty database: every study,
 * run and cost-basis version comes back as it was.
 */
const db = new PrivateMariaDb(DB_PORT + 1)
const out = mkdtempSync(path.join(tmpdir(), 'sw-backup-'))

beforeAll(async () => {
  await db.init()
  migrateAndSeed(db.url)
}, 300_000)

afterAll(async () => {
  await db.stop()
  rmSync(out, { recursive: true, force: true })
}, 60_000)

const snapshot = (database: string) => ({
  studies: db.sql('SELECT id, name, status, lock_version FROM studies ORDER BY id', database),
  runs: db.sql('SELECT id, study_id, kind, cost_basis_version, MD5(result) FROM runs ORDER BY id', database),
  costBases: db.sql('SELECT id, site_id, version, status, MD5(data) FROM cost_bases ORDER BY id', database),
})

describe('backup and restore', () => {
  it('restores every study, run and cost-basis version into a fresh database', () => {
    const before = snapshot('sw_rel')
    expect(before.studies.trim().split('\n').length).toBeGreaterThan(1)
    expect(before.runs.trim()).not.toBe('')
    expect(before.costBases.trim()).not.toBe('')
    const file = path.join(out, 'backup.sql')
    execFileSync('npm', ['run', '--silent', 'db:backup', '--', file], { env: { ...process.env, DATABASE_URL: db.url }, stdio: 'ignore' })
    db.sql(`CREATE DATABASE sw_fresh CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci; GRANT ALL PRIVILEGES ON sw_fresh.* TO 'sw_rel'@'127.0.0.1';`)
    execFileSync('npm', ['run', '--silent', 'db:restore', '--', file], {
      env: { ...process.env, DATABASE_URL: db.url.replace(/\/sw_rel$/, '/sw_fresh') }, stdio: 'ignore',
    })
    expect(snapshot('sw_fresh')).toEqual(before)
  })
})
