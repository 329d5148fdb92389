// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { WAVEGUIDE_PRESETS } from '@shared/physics/waveguide-presets'
import { Waveguide } from '@shared/physics/waveguide'
import type { SavedWaveguide } from '@shared/api/waveguides-api'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import { getByRole, queryAllByRole } from '@/test-utils/by-role'
import { useSessionStore } from '@/stores/session'
import WaveguidesPage from './WaveguidesPage.vue'

const GROUP_ID = '7d3a5f0e-4a61-4c7e-9d9b-2f1a6c0b8e11'
const WG_ID = '5c4b3a29-1807-4f6e-8d5c-4b3a29180706'
const meAs = (role: 'viewer' | 'editor') => ({
  user: { id: '1f0e2d3c-4b5a-4978-8695-a4b3c2d1e0f9', email: 'someone@halden.example', displayName: 'Someone' },
  memberships: [{ groupId: GROUP_ID, groupName: 'Halden Acousto-Optics Lab', role }],
  currentGroupId: GROUP_ID,
})
const spool: SavedWaveguide = {
  id: WG_ID,
  groupId: GROUP_ID,
  name: 'Halden spool 3',
  waveguide: Waveguide.parse({ ...WAVEGUIDE_PRESETS[0].waveguide, name: 'Halden spool 3', lengthM: 2500 }),
  notes: 'Spliced 2024-05',
  createdById: null,
  createdByName: 'Tomas Reyes',
  createdAt: '2026-11-30T09:00:00.000Z',
  updatedAt: '2026-11-30T09:00:00.000Z',
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

async function mountAs(role: 'viewer' | 'editor', extra: Parameters<typeof fakeFetch>[0] = {}) {
  const net = fakeFetch({ 'GET /api/me': { body: meAs(role) }, 'GET /api/waveguides': { body: { waveguides: [spool] } }, ...extra })
  vi.stubGlobal('fetch', net.fn)
  const mounted = await mountWithApp(WaveguidesPage, { path: '/waveguides' })
  await useSessionStore().load()
  await flushPromises()
  return { ...mounted, net }
}

async function openSaved(root: Element) {
  const item = [...root.querySelectorAll('[aria-label="Group waveguides"] .v-list-item')].find((el) => el.textContent?.includes('Halden spool 3'))
  if (!item) throw new Error('saved waveguide not listed')
  ;(item as HTMLElement).click()
  await flushPromises()
}

const button = (root: Element, name: string) => (queryAllByRole(root, 'button', name)[0] ?? null) as HTMLButtonElement | null

describe('WaveguidesPage for a viewer', () => {
  it('lists the group\'s waveguides and offers no create, save, duplicate or delete', async () => {
    const { wrapper, net } = await mountAs('viewer')

    await openSaved(wrapper.element)

    expect(net.calls.some((c) => c.method === 'GET' && c.url === `/api/waveguides?groupId=${GROUP_ID}`)).toBe(true)
    expect(wrapper.text()).toContain('Halden spool 3')
    for (const name of ['New waveguide', 'Save as group waveguide', 'Save changes', 'Duplicate', 'Delete']) expect(button(wrapper.element, name)).toBeNull()
    expect(wrapper.text()).toContain('Read only')
    expect((getByRole(wrapper.element, 'textbox', 'Name') as HTMLInputElement).readOnly).toBe(true)
    expect(button(wrapper.element, 'Use in a new simulation')).not.toBeNull()
  })
})

describe('WaveguidesPage for an editor', () => {
  it('offers create and "save as group waveguide" on a preset, duplicate and delete on a saved one', async () => {
    const { wrapper } = await mountAs('editor')

    expect(button(wrapper.element, 'New waveguide')).not.toBeNull()
    expect(button(wrapper.element, 'Save as group waveguide')).not.toBeNull()
    expect(button(wrapper.element, 'Duplicate')).toBeNull()

    await openSaved(wrapper.element)

    expect(button(wrapper.element, 'Save as group waveguide')).toBeNull()
    expect(button(wrapper.element, 'Duplicate')).not.toBeNull()
    expect(button(wrapper.element, 'Delete')).not.toBeNull()
    expect((getByRole(wrapper.element, 'textbox', 'Name') as HTMLInputElement).readOnly).toBe(false)
  })

  it('saves a preset to the group with its source in the notes and opens the saved copy', async () => {
    const created = { ...spool, id: '9a8b7c6d-5e4f-4a3b-9c2d-1e0f9a8b7c6d', name: WAVEGUIDE_PRESETS[0].waveguide.name }
    const { wrapper, net } = await mountAs('editor', { 'POST /api/waveguides': { status: 201, body: created } })

    button(wrapper.element, 'Save as group waveguide')!.click()
    await flushPromises()

    const post = net.calls.find((c) => c.method === 'POST')!
    const sent = JSON.parse(String(post.init!.body))
    expect(sent).toMatchObject({ groupId: GROUP_ID, waveguide: { name: WAVEGUIDE_PRESETS[0].waveguide.name, lengthM: WAVEGUIDE_PRESETS[0].waveguide.lengthM } })
    expect(sent.notes).toContain(WAVEGUIDE_PRESETS[0].source)
    expect(button(wrapper.element, 'Duplicate')).not.toBeNull()
  })

  it('shows the server\'s message when the name is taken', async () => {
    const message = 'The group already has a waveguide named "Standard single-mode silica fibre" (names are compared ignoring case); choose another name'
    const { wrapper } = await mountAs('editor', { 'POST /api/waveguides': { status: 409, body: { error: { code: 'conflict', message } } } })

    button(wrapper.element, 'Save as group waveguide')!.click()
    await flushPromises()

    expect(getByRole(wrapper.element, 'alert', message)).toBeTruthy()
  })

  it('deletes only after confirming in a dialog', async () => {
    // happy-dom has no visualViewport; Vuetify's overlay positioning listens on it.
    vi.stubGlobal('visualViewport', Object.assign(new EventTarget(), { width: 1280, height: 800, scale: 1, offsetLeft: 0, offsetTop: 0 }))
    const { wrapper, net } = await mountAs('editor', { [`DELETE /api/waveguides/${WG_ID}`]: { status: 204 } })
    await openSaved(wrapper.element)

    button(wrapper.element, 'Delete')!.click()
    await flushPromises()
    const deletesBeforeConfirm = net.calls.filter((c) => c.method === 'DELETE').length
    button(document.body, 'Delete waveguide')!.click()
    await flushPromises()

    expect(deletesBeforeConfirm).toBe(0)
    expect(net.calls.filter((c) => c.method === 'DELETE').map((c) => c.url)).toEqual([`/api/waveguides/${WG_ID}`])
    expect(wrapper.find('[aria-label="Group waveguides"]').exists()).toBe(false)
    expect(wrapper.text()).toContain('No saved waveguides yet')
  })
})
