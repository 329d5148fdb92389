import type { RouteRecordInfo } from 'vue-router'

type NoParams = Record<never, never>

/**
 * Every named route and its params. Adding a route means one entry here, one in routes.ts and (if it belongs
 * in the drawer) one line in nav.ts. With this map, `router.push({ name: 'typo' })` fails the type check.
 */
export interface RouteNamedMap {
  dashboard: RouteRecordInfo<'dashboard', '/', NoParams, NoParams>
  'sign-in': RouteRecordInfo<'sign-in', '/sign-in', NoParams, NoParams>
  'sign-up': RouteRecordInfo<'sign-up', '/sign-up', NoParams, NoParams>
  'reset-password': RouteRecordInfo<'reset-password', '/reset-password', NoParams, NoParams>
  'confirm-email': RouteRecordInfo<'confirm-email', '/confirm-email', NoParams, NoParams>
  'accept-invite': RouteRecordInfo<'accept-invite', '/accept-invite', NoParams, NoParams>
  'group-settings': RouteRecordInfo<'group-settings', '/group', NoParams, NoParams>
  tokens: RouteRecordInfo<'tokens', '/tokens', NoParams, NoParams>
  account: RouteRecordInfo<'account', '/account', NoParams, NoParams>
  'api-reference': RouteRecordInfo<'api-reference', '/reference', NoParams, NoParams>
  admin: RouteRecordInfo<'admin', '/admin', NoParams, NoParams>
  'held-mail': RouteRecordInfo<'held-mail', '/admin/held-mail', NoParams, NoParams>
  'new-simulation': RouteRecordInfo<'new-simulation', '/simulations/new', NoParams, NoParams>
  waveguides: RouteRecordInfo<'waveguides', '/waveguides', NoParams, NoParams>
  runs: RouteRecordInfo<'runs', '/runs', NoParams, NoParams>
  run: RouteRecordInfo<'run', '/runs/:id', { id: string }, { id: string }>
  traces: RouteRecordInfo<'traces', '/traces', NoParams, NoParams>
  trace: RouteRecordInfo<'trace', '/traces/:id', { id: string }, { id: string }>
  sweeps: RouteRecordInfo<'sweeps', '/sweeps', NoParams, NoParams>
  'new-sweep': RouteRecordInfo<'new-sweep', '/sweeps/new', NoParams, NoParams>
  sweep: RouteRecordInfo<'sweep', '/sweeps/:id', { id: string }, { id: string }>
  'not-found': RouteRecordInfo<
    'not-found',
    '/:pathMatch(.*)*',
    { pathMatch: string | string[] },
    { pathMatch: string[] }
  >
}

export type AppRouteName = keyof RouteNamedMap

declare module 'vue-router' {
  interface TypesConfig {
    RouteNamedMap: RouteNamedMap
  }
  interface RouteMeta {
    /** Document title part; the app appends " · Sonoweave". */
    title?: string
    /** Reachable without signing in (sign-in itself, share links, not-found). */
    public?: boolean
    /**
     * A page a share link (?share=) may open. Without a link, a signed-out visitor is sent to sign in and
     * back; with one, the API path returned here is asked first, and a link that needs an account
     * (or is no longer valid) also leads to sign-in rather than to "not found".
     */
    shareProbe?: (params: Record<string, string | string[]>) => string
  }
}
