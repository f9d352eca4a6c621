import type { App } from 'vue'
import { createPinia } from 'pinia'
import { makeVuetify } from './vuetify.ts'
import { router } from '@/router/index.ts'

export function registerPlugins(app: App): void {
  app.use(createPinia())
  app.use(makeVuetify())
  app.use(router)
}
