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
    path: '/runs',
    name: 'runs',
    component: () => import('@/pages/RunsPage.vue'),
    meta: { title: 'Runs' },
  },
  {
    // Public so a share link (?share=) opens without an account; the API decides what may be read.
    path: '/runs/:id',
    name: 'run',
    component: () => import('@/pages/RunPage.vue'),
    meta: { title: 'Run', public: true, shareProbe: (p) => `/api/runs/${encodeURIComponent(String(p.id))}` },
  },
  {
    path: '/sweeps',
    name: 'sweeps',
    component: () => import('@/pages/SweepsPage.vue'),
    meta: { title: 'Sweeps' },
  },
  {
    path: '/sweeps/new',
    name: 'new-sweep',
    component: () => import('@/pages/NewSweepPage.vue'),
    meta: { title: 'New sweep' },
  },
  {
    // Public so a share link (?share=) opens without an account; the API decides what is visible.
    path: '/sweeps/:id',
    name: 'sweep',
    component: () => import('@/pages/SweepPage.vue'),
    meta: { title: 'Sweep', public: true, shareProbe: (p) => `/api/sweeps/${encodeURIComponent(String(p.id))}` },
  },
  {
    path: '/traces',
    name: 'traces',
    component: () => import('@/pages/TracesPage.vue'),
    meta: { title: 'Traces' },
  },
  {
    path: '/traces/:id',
    name: 'trace',
    component: () => import('@/pages/TracePage.vue'),
    meta: { title: 'Trace' },
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
    path: '/sign-up',
    name: 'sign-up',
    component: () => import('@/pages/SignUpPage.vue'),
    meta: { title: 'Create an account', public: true },
  },
  {
    path: '/reset-password',
    name: 'reset-password',
    component: () => import('@/pages/ResetPasswordPage.vue'),
    meta: { title: 'Reset password', public: true },
  },
  {
    path: '/confirm-email',
    name: 'confirm-email',
    component: () => import('@/pages/ConfirmEmailPage.vue'),
    meta: { title: 'Confirm e-mail', public: true },
  },
  {
    path: '/accept-invite',
    name: 'accept-invite',
    component: () => import('@/pages/AcceptInvitePage.vue'),
    meta: { title: 'Invitation', public: true },
  },
  {
    path: '/group',
    name: 'group-settings',
    component: () => import('@/pages/GroupSettingsPage.vue'),
    meta: { title: 'Group' },
  },
  {
    path: '/tokens',
    name: 'tokens',
    component: () => import('@/pages/TokensPage.vue'),
    meta: { title: 'API tokens' },
  },
  {
    path: '/account',
    name: 'account',
    component: () => import('@/pages/AccountPage.vue'),
    meta: { title: 'Account and mail' },
  },
  {
    // Not under /api: the dev server proxies every path that starts with /api to the API.
    path: '/reference',
    name: 'api-reference',
    component: () => import('@/pages/ApiReferencePage.vue'),
    meta: { title: 'API reference' },
  },
  {
    // The API answers 403 to non-admins; the page turns that into an "Admins only" message.
    path: '/admin',
    name: 'admin',
    component: () => import('@/pages/AdminPage.vue'),
    meta: { title: 'Admin' },
  },
  {
    path: '/admin/held-mail',
    name: 'held-mail',
    component: () => import('@/pages/HeldMailPage.vue'),
    meta: { title: 'Held mail' },
  },
  {
    path: '/:pathMatch(.*)*',
    name: 'not-found',
    component: () => import('@/pages/NotFoundPage.vue'),
    meta: { title: 'Not found', public: true },
  },
]
