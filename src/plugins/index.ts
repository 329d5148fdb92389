import type { App } from 'vue'
import { createPinia } from 'pinia'
import { router } from '@/router'
import { usePrefsStore } from '@/stores/prefs'
import { createAppVuetify } from './vuetify'
import '@/styles/app.css'

// ECharts is deliberately absent: chart pages import '@/plugins/echarts' themselves so it lands in their chunks.
export function registerPlugins(app: App): void {
  const pinia = createPinia()
  app.use(pinia)

  const prefs = usePrefsStore(pinia)
  const vuetify = createAppVuetify(prefs.theme)
  // Start in the stored theme so the first paint does not flash; App.vue keeps Vuetify in step afterwards.
  app.use(vuetify)

  app.use(router)
}
