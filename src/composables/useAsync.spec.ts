// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { flushPromises } from '@vue/test-utils'
import { api } from '@/api/client'
import { useAsync, type UseAsync } from './useAsync'
import { mountWithApp, fakeFetch } from '@/test-utils/mount'
import { useSessionStore } from '@/stores/session'

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

function probe(fn: () => Promise<unknown>, on401?: 'sign-in' | 'keep') {
  let handle!: UseAsync<unknown, []>
  const Probe = defineComponent({
    setup() {
      handle = useAsync(fn, { on401 })
      return () => h('div')
    },
  })
  return { Probe, get: () => handle }
}

describe('useAsync', () => {
  it('holds data and clears loading after a successful call', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/things': { body: [1, 2, 3] } }).fn)
    const p = probe(() => api.get('/things'))
    await mountWithApp(p.Probe)

    const pending = p.get().run()
    expect(p.get().loading.value).toBe(true)
    await pending

    expect(p.get().data.value).toEqual([1, 2, 3])
    expect(p.get().error.value).toBeNull()
    expect(p.get().loading.value).toBe(false)
  })

  it('on a 401, clears the session and sends the user to sign-in with a way back', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/runs': { status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in first.' } } } }).fn)
    const p = probe(() => api.get('/runs'))
    const { router } = await mountWithApp(p.Probe, { path: '/somewhere?x=1' })
    useSessionStore().user = { id: 'u1', email: 'mei.okafor@halden.example', isAdmin: false }

    const out = await p.get().run()
    await flushPromises()

    expect(out).toBeNull()
    expect(p.get().error.value?.status).toBe(401)
    expect(useSessionStore().user).toBeNull()
    expect(router.currentRoute.value.name).toBe('sign-in')
    expect(router.currentRoute.value.query.redirect).toBe('/somewhere?x=1')
  })

  it("keeps the user where they are on a 401 when asked to ('keep')", async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/runs': { status: 401, body: { error: { code: 'unauthenticated', message: 'Sign in first.' } } } }).fn)
    const p = probe(() => api.get('/runs'), 'keep')
    const { router } = await mountWithApp(p.Probe, { path: '/' })

    await p.get().run()
    await flushPromises()

    expect(p.get().error.value?.message).toBe('Sign in first.')
    expect(router.currentRoute.value.name).toBe('dashboard')
  })

  it('keeps only the latest of overlapping calls', async () => {
    const resolvers: ((v: string) => void)[] = []
    const p = probe(() => new Promise<string>((r) => resolvers.push(r)))
    await mountWithApp(p.Probe)

    const first = p.get().run()
    const second = p.get().run()
    resolvers[1]!('second')
    await second
    resolvers[0]!('first')
    await first

    expect(p.get().data.value).toBe('second')
  })
})
