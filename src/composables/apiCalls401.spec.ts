// @vitest-environment happy-dom
// Calls that once kept their own try/catch now go through useAsync, so a lapsed session sends the user to
// sign in (and back) from them too.
import { afterEach, describe, expect, it, vi } from 'vitest'
import { computed, defineComponent, h, ref } from 'vue'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import { useRunOutput } from '@/composables/useRunOutput'
import { useGroupWaveguides } from '@/composables/useGroupWaveguides'

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

const signedOut = { status: 401, body: { error: { code: 'unauthorized', message: 'Sign in first' } } }
const RUN = '4c1f6d1e-8a7b-4b45-9d0e-2f6a1c3b5d7e'

describe('a 401 from a component’s own loads', () => {
  it('sends the user from the saved waveguides to sign-in, and back afterwards', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/waveguides': signedOut }).fn)
    const Probe = defineComponent(() => {
      const saved = useGroupWaveguides(computed(() => 'a1b2c3d4-0000-4000-8000-000000000001'))
      return () => h('p', saved.error.value?.message ?? '')
    })

    const { router } = await mountWithApp(Probe, { path: '/traces' })

    // The sign-in page loads lazily: wait for the navigation, however long the machine takes.
    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('sign-in'), { timeout: 30_000 })
    expect(router.currentRoute.value.query.redirect).toBe('/traces')
  })

  it('does the same for a run’s binary output arrays', async () => {
    vi.stubGlobal('fetch', fakeFetch({ [`GET /api/runs/${RUN}/arrays/time_ns`]: signedOut, [`GET /api/runs/${RUN}/arrays/ch1_pump_out`]: signedOut }).fn)
    const Probe = defineComponent(() => {
      const out = useRunOutput(ref(RUN), ref('pumpOut' as const), ref(0))
      return () => h('p', out.error.value?.message ?? '')
    })

    const { router, wrapper } = await mountWithApp(Probe, { path: `/runs/${RUN}` })

    await vi.waitFor(() => expect(router.currentRoute.value.name).toBe('sign-in'), { timeout: 30_000 })
    expect(wrapper.text()).toBe('Sign in first')
  })
})
