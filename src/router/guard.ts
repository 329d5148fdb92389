import type { Router } from 'vue-router'
import { useSessionStore } from '@/stores/session'

/** Pages that make no sense once signed in; a signed-in visitor goes home instead. */
const SIGNED_OUT_ONLY = new Set(['sign-in', 'sign-up'])

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
    if (!to.meta.public && !session.isSignedIn) return { name: 'sign-in', query: { redirect: to.fullPath } }
    if (session.isSignedIn && typeof to.name === 'string' && SIGNED_OUT_ONLY.has(to.name)) return { name: 'dashboard' }
    return true
  })
}
