import { computed, ref, shallowRef } from 'vue'
import { ApiError, errorText } from '@/api/http.ts'

export type AsyncStatus = 'idle' | 'loading' | 'success' | 'error'

/**
 * Wrap an async call: { data, status, error, errorMessage, run }.
 * Only the latest call writes its result (earlier answers arriving late are dropped).
 */
export function useAsync<T, A extends unknown[]>(fn: (...args: A) => Promise<T>) {
  const data = shallowRef<T | null>(null)
  const status = ref<AsyncStatus>('idle')
  const error = shallowRef<unknown>(null)
  let seq = 0

  const errorMessage = computed(() => (error.value ? errorText(error.value) : ''))
  const forbidden = computed(() => error.value instanceof ApiError && error.value.status === 403)
  const notFound = computed(() => error.value instanceof ApiError && error.value.status === 404)

  async function run(...args: A): Promise<T | undefined> {
    const mine = ++seq
    status.value = 'loading'
    error.value = null
    try {
      const result = await fn(...args)
      if (mine === seq) {
        data.value = result
        status.value = 'success'
      }
      return result
    } catch (err) {
      if (mine === seq) {
        error.value = err
        status.value = 'error'
      }
      return undefined
    }
  }

  return { data, status, error, errorMessage, forbidden, notFound, run }
}
