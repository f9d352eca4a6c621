import { createVuetify } from 'vuetify'
import * as components from 'vuetify/components'
import * as directives from 'vuetify/directives'
import { vi } from 'vitest'
import type { UserView } from '@shared/schemas/identity.ts'

export function testVuetify() {
  return createVuetify({ components, directives })
}

export function demoUser(over: Partial<UserView> = {}): UserView {
  return {
    id: 3,
    email: 'engineer@halvard.example',
    name: 'Nora Castellanos',
    isAdmin: false,
    unitSystem: 'SI',
    memberships: [
      { siteId: 1, siteName: 'Cobalt Ridge fermentation plant', siteCode: 'cobalt-ridge', role: 'engineer' },
      { siteId: 2, siteName: 'Marrow Bay coatings plant', siteCode: 'marrow-bay', role: 'reviewer' },
    ],
    ...over,
  }
}

export interface FakeCall {
  method: string
  url: string
  body: unknown
}

/** Replace fetch with a router of canned answers; returns the calls made. */
export function fakeFetch(handler: (method: string, url: string, body: unknown) => { status: number; body?: unknown }): FakeCall[] {
  const calls: FakeCall[] = []
  vi.stubGlobal(
    'fetch',
    vi.fn(async (url: string, init?: RequestInit) => {
      const method = init?.method ?? 'GET'
      const body = typeof init?.body === 'string' ? (JSON.parse(init.body) as unknown) : undefined
      calls.push({ method, url, body })
      const r = handler(method, url, body)
      return new Response(r.body === undefined ? '' : JSON.stringify(r.body), { status: r.status, headers: { 'Content-Type': 'application/json' } })
    }),
  )
  return calls
}

/** Vuetify's overlays (dialogs, menus) read the visual viewport, which happy-dom does not provide. */
export function stubVisualViewport(): void {
  vi.stubGlobal('visualViewport', { width: 1024, height: 768, offsetLeft: 0, offsetTop: 0, pageLeft: 0, pageTop: 0, scale: 1, addEventListener: () => {}, removeEventListener: () => {} })
}
