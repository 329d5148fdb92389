import type { RouteRecordRaw } from 'vue-router'
import type { AppRouteName } from './route-names'

type AppRoute = RouteRecordRaw & { name: AppRouteName }

// Pages are lazy: each becomes its own chunk, so a chart-heavy page never weighs on the first load.
export const routes: AppRoute[] = [
  {
    path: '/',
    name: 'dashboard',
    component: () => import('@/pages/DashboardPage.vue'),
    meta: { title: 'Dashboard' },
  },
  {
    path: '/simulations/new',
    name: 'new-simulation',
    component: () => import('@/pages/NewSimulationPage.vue'),
    meta: { title: 'New simulation' },
  },
  {
    path: '/waveguides',
    name: 'waveguides',
    component: () => import('@/pages/WaveguidesPage.vue'),
    meta: { title: 'Waveguides' },
  },
  {
    path: '/sign-in',
    name: 'sign-in',
    component: () => import('@/pages/SignInPage.vue'),
    meta: { title: 'Sign in', public: true },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('@/pages/NotFoundPage.vue'),
    meta: { title: 'Not found', public: true },
  },
]
