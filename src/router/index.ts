import { createRouter, createWebHistory, type RouterHistory } from 'vue-router'
import { installAuthGuard } from './guard'
import { routes } from './routes'
import './route-names'

export function createAppRouter(history: RouterHistory = createWebHistory()) {
  const router = createRouter({
    history,
    routes,
    scrollBehavior: (_to, _from, saved) => saved ?? { top: 0 },
  })
  router.afterEach((to) => {
    document.title = to.meta.title ? `${to.meta.title} · Sonoweave` : 'Sonoweave'
  })
  return router
}

export const router = createAppRouter()
// Only the app's router: component tests build their own without the session round-trip.
installAuthGuard(router)
