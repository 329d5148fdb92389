// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import DashboardHealthCard from './DashboardHealthCard.vue'
import { mountWithApp, fakeFetch } from '@/test-utils/mount'
import { getByRole, queryAllByRole } from '@/test-utils/by-role'

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

describe('DashboardHealthCard', () => {
  it('shows each dependency, the version and the round trip in ms', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/health': { body: { ok: true, db: 'ok', queue: 'not-configured', version: '0.1.0' } } }).fn)

    const { wrapper } = await mountWithApp(DashboardHealthCard)
    await flushPromises()

    const table = getByRole(wrapper.element, 'table', 'Service health')
    const rows = Array.from(table.querySelectorAll('tr')).map((r) =>
      Array.from(r.children)
        .map((c) => c.textContent!.replace(/\s+/g, ' ').trim())
        .join(' '),
    )
    expect(rows[0]).toMatch(/^API up [\d.]+ ms round trip$/)
    expect(rows[1]).toMatch(/^Database up/)
    expect(rows[2]).toMatch(/^Job queue not attached/)
    expect(rows[3]).toBe('Version 0.1.0')
    expect(wrapper.text()).toContain('all up')
  })

  it('reads a 503 as a reading with the database down, not as an error', async () => {
    vi.stubGlobal('fetch', fakeFetch({ 'GET /api/health': { status: 503, body: { ok: false, db: 'down', queue: 'ok', version: '0.1.0' } } }).fn)

    const { wrapper } = await mountWithApp(DashboardHealthCard)
    await flushPromises()

    const table = getByRole(wrapper.element, 'table', 'Service health')
    expect(table.textContent).toMatch(/API\s*up/)
    expect(table.textContent).toMatch(/Database\s*down/)
    expect(wrapper.text()).toContain('degraded')
    expect(queryAllByRole(wrapper.element, 'alert')).toHaveLength(0)
  })

  it('shows the API error message with a retry that asks again', async () => {
    let calls = 0
    vi.stubGlobal(
      'fetch',
      fakeFetch({
        'GET /api/health': () =>
          ++calls === 1
            ? { status: 500, body: { error: { code: 'internal', message: 'Unexpected error.', requestId: 'req-42' } } }
            : { body: { ok: true, db: 'ok', queue: 'ok', version: '0.1.0' } },
      }).fn,
    )

    const { wrapper } = await mountWithApp(DashboardHealthCard)
    await flushPromises()
    const alert = getByRole(wrapper.element, 'alert')
    expect(alert.textContent).toContain('Unexpected error.')
    expect(alert.textContent).toContain('req-42')

    getByRole(alert, 'button', 'Retry').click()
    await flushPromises()

    expect(calls).toBe(2)
    getByRole(wrapper.element, 'table', 'Service health')
  })
})
