import type { RouteLocationRaw } from 'vue-router'
import type { AppRouteName } from './route-names'

export interface NavItem {
  title: string
  /** An mdi icon name. */
  icon: string
  to: RouteLocationRaw & { name: AppRouteName }
  /** Shown only to site admins (e.g. the queue view). */
  adminOnly?: boolean
  /** Shown only when signed in. */
  signedInOnly?: boolean
}

/**
 * The drawer, top to bottom. One line per page; add yours when its route exists (in this order:
 * Dashboard, New simulation, Runs, Sweeps, Traces, Waveguides, Group, Queue (admin)).
 */
export const navItems: NavItem[] = [
  { title: 'Dashboard', icon: 'mdi-view-dashboard-outline', to: { name: 'dashboard' } },
  { title: 'New simulation', icon: 'mdi-plus-box-outline', to: { name: 'new-simulation' } },
  { title: 'Runs', icon: 'mdi-format-list-bulleted-square', to: { name: 'runs' } },
  { title: 'Sweeps', icon: 'mdi-chart-timeline-variant', to: { name: 'sweeps' } },
  { title: 'Traces', icon: 'mdi-chart-bell-curve', to: { name: 'traces' } },
  { title: 'Waveguides', icon: 'mdi-sine-wave', to: { name: 'waveguides' } },
  { title: 'Group', icon: 'mdi-account-group-outline', to: { name: 'group-settings' }, signedInOnly: true },
  { title: 'Admin', icon: 'mdi-shield-account-outline', to: { name: 'admin' }, adminOnly: true },
]

export function visibleNavItems(items: NavItem[], who: { signedIn: boolean; admin: boolean }): NavItem[] {
  return items.filter((i) => (!i.adminOnly || who.admin) && (!i.signedInOnly || who.signedIn))
}
