import { ref } from 'vue'

/** True once GET /outbox answered 200 (development mail capture, system admins only). */
export const outboxAvailable = ref(false)
let probed: number | null = null

/** Ask once per person whether the outbox is there; the drawer shows its entry only then. */
export function probeOutbox(userId: number | null | undefined, isSystemAdmin: boolean): void {
  if (!isSystemAdmin || userId == null) {
    outboxAvailable.value = false
    probed = null
    return
  }
  if (probed === userId) return
  probed = userId
  import('@/api/outbox.ts')
    .then(({ outboxApi }) => outboxApi.get({ quiet401: true }))
    .then(() => {
      outboxAvailable.value = true
    })
    .catch(() => {
      outboxAvailable.value = false
    })
}
