import { computed, ref, shallowRef } from 'vue'
import { ApiError, errorText } from '@/api/http.ts'

export type AsyncStatus = 'idle' | 'loading' | 'success' | 'error'

/**
 * Wrap an async call: { data, status, loading, error, errorMessage, run, retry, reset }.
 * Every screen that talks to the API keeps its status, error and retry here; the error banner
 * (AppErrorAlert) takes `error` and `@retry="x.retry"`.
 *
 * Only the latest call writes its result: an earlier answer arriving late is dropped, and `run`
 * resolves to undefined for it, as it does for a failed call (the error is in `error`).
 * `retry` runs the last call again with the same arguments.
 */
export function useAsync<T, A extends unknown[]>(fn: (...args: A) => Promise<T>) {
  const data = shallowRef<T | null>(null)
  const status = ref<AsyncStatus>('idle')
  const error = shallowRef<unknown>(null)
  let seq = 0
  let lastArgs: A | null = null

  const loading = computed(() => status.value === 'loading')
  const errorMessage = computed(() => (error.value ? errorText(error.value) : ''))
  const forbidden = computed(() => error.value instanceof ApiError && error.value.status === 403)
  const notFound = computed(() => error.value instanceof ApiError && error.value.status === 404)

  async function run(...args: A): Promise<T | undefined> {
    const mine = ++seq
    lastArgs = args
    status.value = 'loading'
    error.value = null
    try {
      const result = await fn(...args)
      if (mine !== seq) return undefined
      data.value = result
      status.value = 'success'
      return result
    } catch (err) {
      if (mine === seq) {
        error.value = err
        status.value = 'error'
      }
      return undefined
    }
  }

  function retry(): Promise<T | undefined> {
    return lastArgs ? run(...lastArgs) : Promise.resolve(undefined)
  }

  /** Forget the error (and the answer, with `clearData`), e.g. when a dialog opens again. */
  function reset(clearData = false): void {
    seq++
    error.value = null
    status.value = 'idle'
    if (clearData) data.value = null
  }

  return { data, status, loading, error, errorMessage, forbidden, notFound, run, retry, reset }
}
