import type { RouteLocationNormalized, Router } from 'vue-router'
import { useSessionStore } from '@/stores/session'

/** Pages that make no sense once signed in; a signed-in visitor goes home instead. */
const SIGNED_OUT_ONLY = new Set(['sign-in', 'sign-up'])

const toSignIn = (to: RouteLocationNormalized, reason?: string) => ({ name: 'sign-in' as const, query: { redirect: to.fullPath, ...(reason ? { reason } : {}) } })

/**
 * Whether a signed-out visitor's share link opens the page by itself. A members-only link (or one that
 * was revoked) answers 401/404 to them: signing in is the way on, not a "not found" page.
 */
async function shareOpensAnonymously(probe: string, share: string): Promise<boolean> {
  try {
    const res = await fetch(`${probe}?share=${encodeURIComponent(share)}`, { credentials: 'same-origin', headers: { Accept: 'application/json' } })
    return res.ok || (res.status >= 500 && res.status < 600)
  } catch {
    return true // offline or the server is down: let the page show its own error
  }
}

/**
 * Sends anonymous visitors of non-public pages to sign-in (and back afterwards). The session is
 * loaded once, on the first navigation; the API stays the real gatekeeper.
 */
export function installAuthGuard(router: Router): void {
  router.beforeEach(async (to) => {
    const session = useSessionStore()
    await session.ensureLoaded()
    // /api/me failed for another reason (server down): let the page show its own error.
    if (session.status === 'error') return true
    if (!to.meta.public && !session.isSignedIn) return toSignIn(to)
    if (to.meta.shareProbe && !session.isSignedIn) {
      const share = typeof to.query.share === 'string' ? to.query.share : ''
      if (!share) return toSignIn(to, 'group')
      if (!(await shareOpensAnonymously(to.meta.shareProbe(to.params), share))) return toSignIn(to, 'share')
    }
    if (session.isSignedIn && typeof to.name === 'string' && SIGNED_OUT_ONLY.has(to.name)) return { name: 'dashboard' }
    return true
  })
}
