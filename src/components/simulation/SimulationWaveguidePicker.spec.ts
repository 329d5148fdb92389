// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { WAVEGUIDE_PRESETS } from '@shared/physics/waveguide-presets'
import { Waveguide } from '@shared/physics/waveguide'
import type { SavedWaveguide } from '@shared/api/waveguides-api'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import { useSessionStore } from '@/stores/session'
import SimulationWaveguidePicker from './SimulationWaveguidePicker.vue'

const GROUP_ID = '7d3a5f0e-4a61-4c7e-9d9b-2f1a6c0b8e11'
const rib: SavedWaveguide = {
  id: '5c4b3a29-1807-4f6e-8d5c-4b3a29180706',
  groupId: GROUP_ID,
  name: 'Halden rib R7',
  waveguide: Waveguide.parse({ ...WAVEGUIDE_PRESETS[0].waveguide, name: 'Halden rib R7', lengthM: 0.07, effectiveAreaUm2: 2.3 }),
  notes: 'Wafer 7, die 3',
  createdById: null,
  createdByName: null,
  createdAt: '2026-11-30T09:00:00.000Z',
  updatedAt: '2026-11-30T09:00:00.000Z',
}
const me = {
  user: { id: '1f0e2d3c-4b5a-4978-8695-a4b3c2d1e0f9', email: 'mei.okafor@halden.example', displayName: 'Mei Okafor' },
  memberships: [{ groupId: GROUP_ID, groupName: 'Halden Acousto-Optics Lab', role: 'viewer' }],
  currentGroupId: GROUP_ID,
}

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

async function mountPicker(props: Record<string, unknown>, waveguides: unknown = { body: { waveguides: [rib] } }) {
  vi.stubGlobal('fetch', fakeFetch({ 'GET /api/me': { body: me }, 'GET /api/waveguides': waveguides as never }).fn)
  const mounted = await mountWithApp(SimulationWaveguidePicker, { path: '/simulations/new', props })
  await useSessionStore().load()
  await flushPromises()
  return mounted
}

describe('SimulationWaveguidePicker', () => {
  it('offers the group\'s saved waveguides after the presets, and hands over a copy of the chosen one', async () => {
    const { wrapper } = await mountPicker({ modelValue: WAVEGUIDE_PRESETS[0].waveguide, presetId: WAVEGUIDE_PRESETS[0].id })
    const select = wrapper.findComponent({ name: 'VSelect' })

    const values = (select.props('items') as { value?: string; title: string }[]).map((i) => i.value ?? `# ${i.title}`)
    select.vm.$emit('update:modelValue', `saved:${rib.id}`)

    expect(values).toEqual(['# Built-in platforms', ...WAVEGUIDE_PRESETS.map((p) => p.id), '# Group waveguides', `saved:${rib.id}`])
    expect(wrapper.emitted('update:presetId')!.at(-1)).toEqual([null])
    expect(wrapper.emitted('update:modelValue')!.at(-1)).toEqual([rib.waveguide])
  })

  it('shows an unedited copy of a saved waveguide as that waveguide, with its notes', async () => {
    const { wrapper } = await mountPicker({ modelValue: structuredClone(rib.waveguide), presetId: null })

    expect(wrapper.findComponent({ name: 'VSelect' }).props('modelValue')).toBe(`saved:${rib.id}`)
    expect(wrapper.text()).toContain('Wafer 7, die 3')
  })

  it('still offers the presets, and says why, when the group\'s list cannot be loaded', async () => {
    const { wrapper } = await mountPicker(
      { modelValue: WAVEGUIDE_PRESETS[0].waveguide, presetId: WAVEGUIDE_PRESETS[0].id },
      { status: 503, body: { error: { code: 'unavailable', message: 'Database is restarting' } } },
    )

    expect(wrapper.text()).toContain('Group waveguides could not be loaded: Database is restarting')
    expect((wrapper.findComponent({ name: 'VSelect' }).props('items') as unknown[]).length).toBe(WAVEGUIDE_PRESETS.length + 1)
  })
})
