/**
 * Prints the API route table (method, path, who may call it, what it does) as Markdown, from the
 * routes' own declarations. The README's API table is this output; a test keeps the two in step.
 */
import { createApp } from '../server/app.ts'
import { routeTable, type Access } from '../server/routes/define.ts'

export function who(a: Access): string {
  if (a.kind === 'public') return 'anyone'
  if (a.kind === 'signedIn') return 'signed in'
  if (a.kind === 'systemAdmin') return 'system admin'
  return a.roles.length === 4 ? 'any member' : a.roles.join(', ')
}

export function routeRows(): string[] {
  createApp()
  const seen = new Set<string>()
  const rows: string[] = []
  for (const r of routeTable) {
    const key = `${r.method} ${r.path}`
    if (seen.has(key)) continue
    seen.add(key)
    rows.push(`| \`${r.method.toUpperCase()} ${r.path}\` | ${who(r.access)} | ${r.summary} |`)
  }
  return rows
}

if (process.argv[1]?.endsWith('routes.ts')) {
  console.log('| method and path (under /api/v1) | who | what |\n|---|---|---|')
  for (const r of routeRows()) console.log(r)
  process.exit(0)
}
