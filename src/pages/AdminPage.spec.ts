// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import type { QueueActivity } from '@shared/api/queue'
import type { QueueStatus } from '@shared/api/runs'
import type { AdminUser } from '@/api/admin'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import { getByRole, queryAllByRole } from '@/test-utils/by-role'
import { useSessionStore } from '@/stores/session'
import AdminPage from './AdminPage.vue'

vi.mock('@/plugins/echarts', async () => {
  const { defineComponent, h } = await import('vue')
  return { VChart: defineComponent({ props: ['option', 'theme', 'autoresize'], setup: () => () => h('div', { class: 'vchart-stub' }) }), chartThemeName: () => 'light' }
})

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
// Three samples 30 s apart ending now: the queue grew to 5 while 3 of 6 threads were busy.
const activity = (): QueueActivity => {
  const at = (k: number) => new Date(Date.now() - (2 - k) * 30_000).toISOString()
  return {
    sampleIntervalS: 30,
    windowS: 3600,
    samples: [
      { at: at(0), queued: 1, running: 2, busyThreads: 2, threads: 6 },
      { at: at(1), queued: 5, running: 3, busyThreads: 3, threads: 6 },
      { at: at(2), queued: 3, running: 1, busyThreads: 1, threads: 6 },
    ],
    workers: queue.workers.map((w, i) => ({ ...w, runsFinished: [12, 0][i], lastSeenAt: i === 1 ? new Date(Date.now() - 45_000).toISOString() : w.lastSeenAt })),
  }
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

const adminOk = { 'GET /api/queue': { body: queue }, 'GET /api/queue/activity': () => ({ body: activity() }), 'GET /api/admin/users': { body: { users } } }
const adminSwitch = (root: Element, name: string) => getByRole(root, 'switch', `Site admin: ${name}`) as HTMLInputElement

describe('AdminPage', () => {
  it('shows the queue figures with units, the hour in a chart with its summary, and one card per worker', async () => {
    const { wrapper } = await mountWith(adminOk)

    expect(wrapper.get('[data-testid="admin-queued"]').text()).toBe('3 runs')
    expect(wrapper.get('[data-testid="admin-running"]').text()).toBe('1 run')
    expect(wrapper.get('[data-testid="admin-threads"]').text()).toBe('1 of 6')
    expect(wrapper.get('[data-testid="admin-mean-wait"]').text()).toBe('42 s')
    expect(wrapper.get('[data-testid="admin-chart-summary"]').text()).toMatch(/^Since \d{1,2}:\d\d(\s?[AP]M)?: up to 5 runs waiting, up to 3 of 6 solver threads busy \(now 3 waiting, 1 busy\)\.$/)
    expect(queryAllByRole(wrapper.element, 'table').filter((t) => t.getAttribute('aria-label') === 'Worker processes')).toHaveLength(0)

    const cards = [...wrapper.element.querySelectorAll('ul[aria-label="Worker processes"] > li')]
    expect(cards.map((c) => c.getAttribute('aria-label'))).toEqual(['Worker halden-compute-1, process 4711', 'Worker halden-compute-2, process 90210'])
    const text = cards.map((c) => c.textContent?.replace(/\s+/g, ' ') ?? '')
    expect(text[0]).toContain('1 of 4 threads')
    expect(text[0]).toMatch(/Runs finished ?12/)
    expect(text[1]).toContain('0 of 2 threads')
    expect(text[1]).toMatch(/seen 4\d s ago/)
    // One pip per thread, filled for the busy ones.
    expect(cards[0].querySelectorAll('.admin-workers__pip')).toHaveLength(4)
    expect(cards[0].querySelectorAll('.admin-workers__pip--busy')).toHaveLength(1)
    // A worker silent for more than two reports is marked late.
    expect(cards[0].querySelector('.admin-workers__dot')!.classList.contains('bg-success')).toBe(true)
    expect(cards[1].querySelector('.admin-workers__dot')!.classList.contains('bg-warning')).toBe(true)
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
    const { wrapper } = await mountWith({ 'GET /api/queue': denied, 'GET /api/queue/activity': denied, 'GET /api/admin/users': denied }, false)

    expect(wrapper.text()).toContain('Admins only')
    expect(wrapper.find('[data-testid="admin-queued"]').exists()).toBe(false)
    expect(queryAllByRole(wrapper.element, 'table')).toHaveLength(0)
  })
})
