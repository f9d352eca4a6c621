import request from 'supertest'
import type { Express } from 'express'
import { createApp } from '../../server/app.ts'
import { recordAnswers } from './answers.ts'

export const DEMO_PASSWORD = 'scrubwright-demo'
export const PEOPLE = {
  admin: 'admin@halvard.example',
  economist: 'economist@halvard.example',
  engineer: 'engineer@halvard.example',
  reviewer: 'reviewer@halvard.example',
  bayEngineer: 'bay.engineer@halvard.example',
} as const
export type Person = keyof typeof PEOPLE

// every JSON answer of the test file is checked against the schema its route documents (answers.ts)
recordAnswers()

let app: Express | undefined
export function testApp(): Express {
  app ??= createApp({ LOGIN_RATE_LIMIT: 10000 })
  return app
}

const tokens = new Map<Person, string>()
/** A bearer token for a demo person (signed in once per test file). */
export async function tokenFor(who: Person): Promise<string> {
  const t = tokens.get(who)
  if (t) return t
  const res = await request(testApp()).post('/api/v1/auth/login').send({ email: PEOPLE[who], password: DEMO_PASSWORD })
  if (res.status !== 200) throw new Error(`sign-in as ${who} failed: ${res.status} ${JSON.stringify(res.body)}`)
  tokens.set(who, res.body.token as string)
  return res.body.token as string
}

export async function siteIds(): Promise<{ cobalt: number; marrow: number }> {
  const res = await request(testApp()).get('/api/v1/sites').set('Authorization', `Bearer ${await tokenFor('admin')}`)
  const by = new Map((res.body as { code: string; id: number }[]).map((s) => [s.code, s.id]))
  return { cobalt: by.get('cobalt-ridge')!, marrow: by.get('marrow-bay')! }
}

export function api() {
  return request(testApp())
}
