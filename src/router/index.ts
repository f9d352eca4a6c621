import { createRouter, createWebHistory, type RouteLocationNormalized, type RouteRecordRaw } from 'vue-router'
import type { Role } from '@shared/schemas/common.ts'
import { useSessionStore } from '@/stores/session.ts'
import { useSiteStore } from '@/stores/site.ts'
import { setUnauthorizedHandler } from '@/api/http.ts'

export type RouteName =
  | 'sign-in'
  | 'home'
  | 'portfolio'
  | 'study'
  | 'compare'
  | 'cost-basis'
  | 'people'
  | 'allocation'
  | 'outbox'
  | 'not-allowed'
  | 'not-found'

declare module 'vue-router' {
  interface RouteMeta {
    /** Reachable without signing in. */
    public?: boolean
    /** Site roles allowed (system admins always are). */
    roles?: Role[]
    /** Only for system admins or admins of some site. */
    adminOnly?: boolean
    title?: string
  }
}

type NamedRoute = RouteRecordRaw & { name: RouteName }

const routes: NamedRoute[] = [
  { path: '/sign-in', name: 'sign-in', component: () => import('@/views/SignInView.vue'), meta: { public: true, title: 'Sign in' } },
  { path: '/', name: 'home', redirect: () => ({ name: 'portfolio' }) },
  { path: '/portfolio', name: 'portfolio', component: () => import('@/views/PortfolioView.vue'), meta: { title: 'Portfolio' } },
  {
    path: '/sites/:siteId(\\d+)/studies/:studyId(\\d+)/:section(streams|column|checks|economics|options|review|standing|operating)?',
    name: 'study',
    component: () => import('@/views/StudyWorkspaceView.vue'),
    meta: { title: 'Study' },
  },
  { path: '/compare', name: 'compare', component: () => import('@/views/CompareView.vue'), meta: { title: 'Compare options' } },
  { path: '/cost-basis', name: 'cost-basis', component: () => import('@/views/CostBasisView.vue'), meta: { title: 'Site cost basis' } },
  { path: '/people', name: 'people', component: () => import('@/views/PeopleSitesView.vue'), meta: { title: 'People & sites', adminOnly: true } },
  { path: '/allocation', name: 'allocation', component: () => import('@/views/AllocationView.vue'), meta: { title: 'Solvent allocation' } },
  { path: '/outbox', name: 'outbox', component: () => import('@/views/OutboxView.vue'), meta: { title: 'Outbox', adminOnly: true } },
  { path: '/not-allowed', name: 'not-allowed', component: () => import('@/views/NotAllowedView.vue'), meta: { title: 'Not allowed' } },
  { path: '/:pathMatch(.*)*', name: 'not-found', component: () => import('@/views/NotFoundView.vue'), meta: { public: true, title: 'Not found' } },
]

export const router = createRouter({ history: createWebHistory(), routes })

/** The decision of the guard, testable without a router. */
export function guardDecision(
  to: Pick<RouteLocationNormalized, 'meta' | 'fullPath' | 'name'>,
  signedIn: boolean,
  isSystemAdmin: boolean,
  siteRole: Role | null,
  adminSomewhere: boolean,
): true | { name: RouteName; query?: Record<string, string> } {
  if (to.meta.public) {
    if (to.name === 'sign-in' && signedIn) return { name: 'portfolio' }
    return true
  }
  if (!signedIn) return { name: 'sign-in', query: { redirect: to.fullPath } }
  if (to.meta.adminOnly && !isSystemAdmin && !adminSomewhere) return { name: 'not-allowed' }
  if (to.meta.roles && !isSystemAdmin && (siteRole === null || !to.meta.roles.includes(siteRole))) {
    return { name: 'not-allowed' }
  }
  return true
}

router.beforeEach(async (to) => {
  const session = useSessionStore()
  try {
    await session.ensureChecked()
  } catch {
    // server unreachable: let public pages show; others go to sign-in which shows the error
  }
  const site = useSiteStore()
  if (session.signedIn && site.status !== 'success') await site.load()
  const siteParam = Number(to.params.siteId)
  if (session.signedIn && Number.isInteger(siteParam) && siteParam > 0 && siteParam !== site.currentId) {
    if (!site.isMember(siteParam)) return { name: 'not-allowed' }
    site.choose(siteParam)
  }
  const adminSomewhere = session.user?.memberships.some((m) => m.role === 'admin') ?? false
  return guardDecision(to, session.signedIn, session.isSystemAdmin, site.role, adminSomewhere)
})

router.afterEach((to) => {
  document.title = to.meta.title ? `${to.meta.title} · Scrubwright` : 'Scrubwright'
})

setUnauthorizedHandler(() => {
  const session = useSessionStore()
  const site = useSiteStore()
  session.clear()
  site.reset()
  const current = router.currentRoute.value
  if (current.name !== 'sign-in') {
    void router.push({ name: 'sign-in', query: { redirect: current.fullPath, expired: '1' } })
  }
})

/**
 * After a new release the old lazy chunks are gone: when a view fails to load, load the page
 * afresh once (a second failure is shown as it is).
 */
router.onError((err: unknown, to) => {
  const message = err instanceof Error ? err.message : String(err)
  if (!/dynamically imported module|Importing a module script failed|error loading dynamically|Unable to preload CSS/i.test(message)) return
  const key = 'scrubwright.reloadedFor'
  try {
    if (sessionStorage.getItem(key) === to.fullPath) return
    sessionStorage.setItem(key, to.fullPath)
  } catch {
    return
  }
  window.location.assign(to.fullPath)
})
