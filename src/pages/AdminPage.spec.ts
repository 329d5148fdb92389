// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import type { QueueStatus } from '@shared/api/runs'
import type { AdminUser } from '@/api/admin'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import { getByRole, queryAllByRole } from '@/test-utils/by-role'
import { useSessionStore } from '@/stores/session'
import AdminPage from './AdminPage.vue'

const INGRID_ID = '1f0e2d3c-4b5a-4978-8695-a4b3c2d1e0f9'
const TOMAS_ID = '2a1b3c4d-5e6f-4a7b-8c9d-0e1f2a3b4c5d'
const me = (isAdmin: boolean) => ({
  user: { id: INGRID_ID, email: 'ingrid.solvang@halden.example', displayName: 'Ingrid Solvang', isAdmin },
  memberships: [],
  currentGroupId: null,
})
const queue: QueueStatus = {
  queued: 3,
  running: 1,
  meanWaitS: 42,
  workers: [
    { id: 'w-a', host: 'halden-compute-1', pid: 4711, threads: 4, busy: 1, startedAt: '2026-12-01T08:00:00.000Z', lastSeenAt: new Date().toISOString() },
    { id: 'w-b', host: 'halden-compute-2', pid: 90210, threads: 2, busy: 0, startedAt: '2026-12-01T09:30:00.000Z', lastSeenAt: new Date().toISOString() },
  ],
}
const users: AdminUser[] = [
  { id: INGRID_ID, email: 'ingrid.solvang@halden.example', name: 'Ingrid Solvang', isAdmin: true, emailConfirmed: true, createdAt: '2026-11-01T10:00:00.000Z', groupCount: 1 },
  { id: TOMAS_ID, email: 'tomas.reyes@halden.example', name: 'Tomas Reyes', isAdmin: false, emailConfirmed: false, createdAt: '2026-11-02T10:00:00.000Z', groupCount: 1 },
]

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

async function mountWith(routes: Parameters<typeof fakeFetch>[0], isAdmin = true) {
  const net = fakeFetch({ 'GET /api/me': { body: me(isAdmin) }, ...routes })
  vi.stubGlobal('fetch', net.fn)
  const mounted = await mountWithApp(AdminPage, { path: '/admin' })
  await useSessionStore().load()
  await flushPromises()
  return { ...mounted, net }
}

const adminOk = { 'GET /api/queue': { body: queue }, 'GET /api/admin/users': { body: { users } } }
const adminSwitch = (root: Element, name: string) => getByRole(root, 'switch', `Site admin: ${name}`) as HTMLInputElement

describe('AdminPage', () => {
  it('shows the queue figures with units and one row per worker process', async () => {
    const { wrapper } = await mountWith(adminOk)

    expect(wrapper.get('[data-testid="admin-queued"]').text()).toBe('3 runs')
    expect(wrapper.get('[data-testid="admin-running"]').text()).toBe('1 run')
    expect(wrapper.get('[data-testid="admin-mean-wait"]').text()).toBe('42 s')
    const table = getByRole(wrapper.element, 'table', 'Worker processes')
    const rows = [...table.querySelectorAll('tbody tr')].map((r) => r.textContent?.replace(/\s+/g, ' ') ?? '')
    expect(rows).toHaveLength(2)
    expect(rows[0]).toContain('halden-compute-1')
    expect(rows[0]).toContain('4711')
    expect(rows[0]).toContain('4 threads')
    expect(rows[0]).toContain('1 of 4')
    expect(rows[1]).toContain('halden-compute-2')
    expect(rows[1]).toContain('0 of 2')
    expect(rows[1]).toMatch(/\d+ ms ago|\d+(\.\d)? s ago/)
  })

  it('polls /api/queue again every 5 s and stops when the page is gone', async () => {
    vi.useFakeTimers({ toFake: ['setInterval', 'clearInterval'] })
    try {
      const { wrapper, net } = await mountWith(adminOk)
      const queueCalls = () => net.calls.filter((c) => c.url === '/api/queue').length
      const before = queueCalls()
      vi.advanceTimersByTime(5_000)
      await flushPromises()
      expect(queueCalls()).toBe(before + 1)
      wrapper.unmount()
      vi.advanceTimersByTime(10_000)
      await flushPromises()
      expect(queueCalls()).toBe(before + 1)
    } finally {
      vi.useRealTimers()
    }
  })

  it('grants the admin flag with a PATCH carrying { isAdmin: true }', async () => {
    const { wrapper, net } = await mountWith({ ...adminOk, [`PATCH /api/admin/users/${TOMAS_ID}`]: { body: { id: TOMAS_ID, isAdmin: true } } })
    const toggle = adminSwitch(wrapper.element, 'Tomas Reyes')
    expect(toggle.checked).toBe(false)

    toggle.click()
    await flushPromises()

    const patches = net.calls.filter((c) => c.method === 'PATCH')
    expect(patches.map((c) => c.url)).toEqual([`/api/admin/users/${TOMAS_ID}`])
    expect(JSON.parse(String(patches[0]!.init!.body))).toEqual({ isAdmin: true })
    expect(adminSwitch(wrapper.element, 'Tomas Reyes').checked).toBe(true)
    expect(wrapper.text()).toContain('Tomas Reyes is now a site admin')
  })

  it('shows the server\'s message when it refuses a change and leaves the switch as it was', async () => {
    const message = 'You cannot withdraw your own admin flag; ask another admin'
    const { wrapper, net } = await mountWith({
      ...adminOk,
      [`PATCH /api/admin/users/${INGRID_ID}`]: { status: 409, body: { error: { code: 'last_admin', message } } },
    })

    adminSwitch(wrapper.element, 'Ingrid Solvang').click()
    await flushPromises()

    expect(JSON.parse(String(net.calls.find((c) => c.method === 'PATCH')!.init!.body))).toEqual({ isAdmin: false })
    expect(getByRole(wrapper.element, 'alert', message)).toBeTruthy()
    expect(adminSwitch(wrapper.element, 'Ingrid Solvang').checked).toBe(true)
  })

  it('filters the users by name or e-mail', async () => {
    const { wrapper } = await mountWith(adminOk)
    await wrapper.get('input[type="text"]').setValue('reyes')
    expect(queryAllByRole(wrapper.element, 'switch').length).toBe(1)
    expect(adminSwitch(wrapper.element, 'Tomas Reyes')).toBeTruthy()
    await wrapper.get('input[type="text"]').setValue('nobody@')
    expect(wrapper.text()).toContain('No user matches this search.')
  })

  it('tells a non-admin "Admins only" when the API answers 403, and shows no figures', async () => {
    const denied = { status: 403, body: { error: { code: 'forbidden', message: 'Only site administrators can do this' } } }
    const { wrapper } = await mountWith({ 'GET /api/queue': denied, 'GET /api/admin/users': denied }, false)

    expect(wrapper.text()).toContain('Admins only')
    expect(wrapper.find('[data-testid="admin-queued"]').exists()).toBe(false)
    expect(queryAllByRole(wrapper.element, 'table')).toHaveLength(0)
  })
})
