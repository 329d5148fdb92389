// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import App from '@/App.vue'
import { mountWithApp, fakeFetch } from '@/test-utils/mount'
import { getByRole, queryAllByRole } from '@/test-utils/by-role'
import { usePrefsStore } from '@/stores/prefs'
import { THEME_DARK } from '@/plugins/palette'

// Demo people and group of our own invention (see the rules' demo scenario).
const ME = {
  user: { id: 'u1', email: 'ingrid.solvang@halden.example', displayName: 'Ingrid Solvang', isAdmin: false },
  memberships: [{ groupId: 'g1', groupName: 'Halden Acousto-Optics Lab', role: 'owner' }],
}
const HEALTH = { ok: true, db: true, queue: 'ok', version: '0.1.0' }

afterEach(() => {
  vi.unstubAllGlobals()
  localStorage.clear()
  document.body.innerHTML = ''
})

describe('the app shell', () => {
  it('shows the product name, a skip link, labelled icon buttons and the drawer navigation', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/health': { body: HEALTH } }).fn)

    const { wrapper } = await mountWithApp(App)
    const root = wrapper.element.ownerDocument.body

    const banner = getByRole(root, 'banner', 'Sonoweave')
    expect(getByRole(banner, 'link', 'Sonoweave, go to dashboard').textContent).toContain('Sonoweave')
    expect(getByRole(root, 'link', 'Skip to content')).toBeTruthy()
    getByRole(banner, 'button', /^(Hide|Show) navigation$/)
    getByRole(banner, 'button', /^Switch to (dark|light) theme$/)
    const nav = getByRole(root, 'navigation', 'Main')
    expect(getByRole(nav, 'link', 'Dashboard').getAttribute('href')).toBe('/')
    // Anonymous (GET /api/me is 404 here): a sign-in link instead of an account menu.
    getByRole(banner, 'link', 'Sign in')
    expect(queryAllByRole(banner, 'button', /^Account menu/)).toHaveLength(0)
  })

  it('shows the signed-in user and their group', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/me': { body: ME }, 'GET /api/health': { body: HEALTH } }).fn)

    const { wrapper } = await mountWithApp(App)
    await flushPromises()
    const root = wrapper.element.ownerDocument.body

    const banner = getByRole(root, 'banner', 'Sonoweave')
    getByRole(banner, 'button', 'Account menu for Ingrid Solvang')
    expect(banner.textContent).toContain('Halden Acousto-Optics Lab')
    expect(getByRole(root, 'main').textContent).toContain('Halden Acousto-Optics Lab')
  })

  it('switches theme from the toggle and remembers the choice', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/health': { body: HEALTH } }).fn)
    const { wrapper, vuetify } = await mountWithApp(App)
    const root = wrapper.element.ownerDocument.body
    const before = usePrefsStore().theme

    getByRole(root, 'button', /^Switch to (dark|light) theme$/).click()
    await flushPromises()

    const after = usePrefsStore().theme
    expect(after).not.toBe(before)
    expect(vuetify.theme.global.name.value).toBe(after)
    expect(localStorage.getItem('sonoweave.theme')).toBe(after)
    getByRole(root, 'button', after === THEME_DARK ? 'Switch to light theme' : 'Switch to dark theme')
  })

  it('shows the not-found page for an unknown path', async () => {
    vi.stubGlobal('fetch', fakeFetch({}).fn)

    const { wrapper } = await mountWithApp(App, { path: '/no/such/page' })
    await flushPromises()

    const main = getByRole(wrapper.element.ownerDocument.body, 'main')
    expect(getByRole(main, 'heading', 'No page here')).toBeTruthy()
    expect(main.textContent).toContain('/no/such/page')
  })
})
