import { defineStore } from 'pinia'
import { computed, ref, watch } from 'vue'
import type { UserView } from '@shared/schemas/identity.ts'
import type { Role, UnitSystem } from '@shared/schemas/common.ts'
// The identity API (with the schema library) loads on first use, not with the first screen.
const authApi = {
  me: async () => (await import('@/api/identity.ts')).authApi.me(),
  login: async (email: string, password: string) => (await import('@/api/identity.ts')).authApi.login(email, password),
  logout: async () => (await import('@/api/identity.ts')).authApi.logout(),
  updateMe: async (patch: { unitSystem: UnitSystem }) => (await import('@/api/identity.ts')).authApi.updateMe(patch),
  changePassword: async (current: string, next: string) => (await import('@/api/identity.ts')).authApi.changePassword(current, next),
}
import { ApiError, setUnitSystemHeader } from '@/api/http.ts'

/** The signed-in person. The session itself lives in an httpOnly cookie, never in the page. */
export const useSessionStore = defineStore('session', () => {
  const user = ref<UserView | null>(null)
  /** True once we have asked the server who is signed in. */
  const checked = ref(false)

  const signedIn = computed(() => user.value !== null)
  const isSystemAdmin = computed(() => user.value?.isAdmin === true)
  const unitSystem = computed<UnitSystem>(() => user.value?.unitSystem ?? 'SI')
  watch(unitSystem, (s) => setUnitSystemHeader(s), { immediate: true })

  function roleAt(siteId: number | null | undefined): Role | null {
    if (siteId == null || !user.value) return null
    return user.value.memberships.find((m) => m.siteId === siteId)?.role ?? null
  }

  /** Site admin or system admin at the site. */
  function canAdminister(siteId: number | null | undefined): boolean {
    return isSystemAdmin.value || roleAt(siteId) === 'admin'
  }

  /** Ask the server once per page load; a 401 simply means nobody is signed in. */
  async function ensureChecked(): Promise<void> {
    if (checked.value) return
    try {
      user.value = await authApi.me()
    } catch (err) {
      if (!(err instanceof ApiError) || err.status !== 401) throw err
      user.value = null
    } finally {
      checked.value = true
    }
  }

  async function signIn(email: string, password: string): Promise<void> {
    const session = await authApi.login(email, password)
    user.value = session.user
    checked.value = true
  }

  async function signOut(): Promise<void> {
    try {
      await authApi.logout()
    } finally {
      clear()
    }
  }

  /** Forget the person locally (after a 401 or sign-out). */
  function clear(): void {
    user.value = null
    checked.value = true
  }

  /** Change one's own password; this session goes on (the server ends every other one). */
  async function changePassword(current: string, next: string): Promise<void> {
    const session = await authApi.changePassword(current, next)
    user.value = session.user
  }

  async function setUnitSystem(system: UnitSystem): Promise<void> {
    if (!user.value) return
    const previous = user.value.unitSystem
    user.value = { ...user.value, unitSystem: system }
    try {
      user.value = await authApi.updateMe({ unitSystem: system })
    } catch (err) {
      if (user.value) user.value = { ...user.value, unitSystem: previous }
      throw err
    }
  }

  return { user, checked, signedIn, isSystemAdmin, unitSystem, roleAt, canAdminister, ensureChecked, signIn, signOut, clear, setUnitSystem, changePassword }
})
