/**
 * Every JSON answer of the API tests, checked against the response schema its route declares for
 * the OpenAPI document (server/routes/*.ts `doc.response`): the answers the tests really receive
 * must be what the document promises. Recorded in this process (supertest runs the app here) by
 * wrapping Express's res.json; checked once per test file, after its tests.
 */
import express, { type Request } from 'express'
import { afterAll, expect } from 'vitest'
import { ZodType } from 'zod'
import { routeTable } from '../../server/routes/define.ts'

interface Answer {
  method: string
  path: string
  status: number
  body: unknown
}

/** The answers of the current test file (Express may be shared by the files of a worker; the list is not). */
const answers: Answer[] = []
const SINK = Symbol.for('scrubwright.test.answers')
type Sinked = typeof express.response & { [SINK]?: { list: Answer[] } }

/**
 * Record this file's 2xx JSON answers of declared routes (res.json wrapped once per process on
 * Express's shared response prototype) and check them after the file's tests. Call at the top
 * level of a module the test file imports.
 */
export function recordAnswers(): void {
  const proto = express.response as Sinked
  if (!proto[SINK]) {
    const sink = { list: answers }
    proto[SINK] = sink
    const json = proto.json
    proto.json = function (this: express.Response, body: unknown) {
      const req = this.req as Request & { route?: { path?: string } }
      if (this.statusCode >= 200 && this.statusCode < 300 && req.route?.path) {
        sink.list.push({ method: req.method.toLowerCase(), path: String(req.route.path), status: this.statusCode, body: JSON.parse(JSON.stringify(body ?? null)) as unknown })
      }
      return json.call(this, body)
    }
  }
  proto[SINK]!.list = answers
  afterAll(() => {
    const failures: string[] = []
    for (const a of answers.splice(0)) {
      const spec = routeTable.find((r) => r.method === a.method && r.path === a.path)
      const schema = spec?.doc?.response
      if (!(schema instanceof ZodType)) continue
      const r = schema.safeParse(a.body)
      if (!r.success) failures.push(`${a.method} ${a.path} (${a.status}): ${r.error.issues.slice(0, 3).map((i) => `${i.path.join('.')}: ${i.message}`).join('; ')}`)
    }
    expect(failures, 'answers that do not match their documented schema').toEqual([])
  })
}
