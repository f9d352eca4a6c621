import { defineStore } from 'pinia'
import { computed, ref } from 'vue'
import type { SiteView } from '@shared/schemas/identity.ts'
import type { Role } from '@shared/schemas/common.ts'
// loaded on first use (see stores/session.ts)
const sitesApi = { list: async () => (await import('@/api/identity.ts')).sitesApi.list() }
import { errorText } from '@/api/http.ts'
import { useSessionStore } from './session.ts'

export const SITE_STORAGE_KEY = 'scrubwright.siteId'

function readRemembered(): number | null {
  try {
    const v = Number(localStorage.getItem(SITE_STORAGE_KEY))
    return Number.isInteger(v) && v > 0 ? v : null
  } catch {
    return null
  }
}

/** The sites the person may see and the one chosen (remembered in this browser). */
export const useSiteStore = defineStore('site', () => {
  const sites = ref<SiteView[]>([])
  const status = ref<'idle' | 'loading' | 'success' | 'error'>('idle')
  const error = ref<string | null>(null)
  const currentId = ref<number | null>(readRemembered())

  const current = computed(() => sites.value.find((s) => s.id === currentId.value) ?? null)

  /** The person's role at the chosen site (a system admin without a membership has none). */
  const role = computed<Role | null>(() => {
    const session = useSessionStore()
    return session.roleAt(currentId.value) ?? current.value?.role ?? null
  })

  const canEditStudies = computed(() => role.value === 'engineer')
  const canEditCostBasis = computed(() => role.value === 'economist' || role.value === 'admin')

  async function load(force = false): Promise<void> {
    if (status.value === 'success' && !force) return
    status.value = 'loading'
    error.value = null
    try {
      sites.value = await sitesApi.list()
      status.value = 'success'
      if (!sites.value.some((s) => s.id === currentId.value)) {
        choose(sites.value[0]?.id ?? null)
      }
    } catch (err) {
      status.value = 'error'
      error.value = errorText(err)
    }
  }

  function choose(id: number | null): void {
    currentId.value = id
    try {
      if (id == null) localStorage.removeItem(SITE_STORAGE_KEY)
      else localStorage.setItem(SITE_STORAGE_KEY, String(id))
    } catch {
      // storage may be unavailable (private mode); the choice still holds for this visit
    }
  }

  function isMember(id: number): boolean {
    return sites.value.some((s) => s.id === id)
  }

  function reset(): void {
    sites.value = []
    status.value = 'idle'
    error.value = null
  }

  return { sites, status, error, currentId, current, role, canEditStudies, canEditCostBasis, load, choose, isMember, reset }
})
