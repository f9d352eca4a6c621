import { describe, expect, it } from 'vitest'
import { useAsync } from '@/composables/useAsync.ts'
import { ApiError } from '@/api/http.ts'

function deferred<T>() {
  let resolve!: (v: T) => void
  let reject!: (e: unknown) => void
  const promise = new Promise<T>((res, rej) => {
    resolve = res
    reject = rej
  })
  return { promise, resolve, reject }
}

describe('useAsync', () => {
  it('keeps the latest answer only: a late earlier answer is dropped and resolves to undefined', async () => {
    const pending = [deferred<string>(), deferred<string>()]
    let i = 0
    const call = useAsync((_id: number) => pending[i++]!.promise)
    const first = call.run(1)
    const second = call.run(2)
    pending[1]!.resolve('two')
    expect(await second).toBe('two')
    pending[0]!.resolve('one')
    expect(await first).toBeUndefined()
    expect(call.data.value).toBe('two')
    expect(call.status.value).toBe('success')
  })

  it('holds the error and retries the last call with the same arguments', async () => {
    const seen: number[] = []
    let fail = true
    const call = useAsync(async (id: number) => {
      seen.push(id)
      if (fail) throw new ApiError(503, 'unavailable', 'The database is not reachable.')
      return id * 2
    })
    expect(await call.run(21)).toBeUndefined()
    expect(call.status.value).toBe('error')
    expect(call.errorMessage.value).toContain('database')
    fail = false
    expect(await call.retry()).toBe(42)
    expect(seen).toEqual([21, 21])
    expect(call.error.value).toBeNull()
    expect(call.loading.value).toBe(false)
  })

  it('reset forgets the error, and an answer still on its way no longer lands', async () => {
    const d = deferred<string>()
    const call = useAsync(() => d.promise)
    const p = call.run()
    call.reset()
    d.resolve('late')
    expect(await p).toBeUndefined()
    expect(call.data.value).toBeNull()
    expect(call.status.value).toBe('idle')
  })
})
