// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { SimulationConfig } from '@shared/physics/simulation-config'
import type { SensingMapResponse } from '@shared/api/sensing-map'
import type { SweepDetail } from '@shared/api/sweeps'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import SensingMap from './SensingMap.vue'

// The charts are drawn by ECharts, which needs a real canvas; their options are not what this spec checks.
vi.mock('@/plugins/echarts', () => ({
  VChart: defineComponent({ props: ['option', 'theme', 'autoresize'], setup: () => () => h('div', { class: 'vchart-stub' }) }),
  chartThemeName: () => 'light',
}))

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

const ID = '00000000-0000-4000-8000-000000000001'
const base = SimulationConfig.parse({
  waveguide: { name: 'Fibre', lengthM: 100, groupIndex: 1.468, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, brillouinShiftGHz: 10.8, linewidthMHz: 30 },
  channels: [{ pump: { pulses: [{ shape: 'gaussian', peakPowerW: 0.1, centreNs: 800, fwhmNs: 50 }] }, stokes: { backgroundPowerW: 1e-4 } }],
  windowNs: 2000,
})
const point = (i: number) => ({ index: i, values: [i * 10], runId: ID, status: 'succeeded', progress: 1, attempt: 0, error: null, startedAt: null, finishedAt: null, metrics: {} })
const sweep = (axisField: 'detuningMHz' | 'pumpPowerW') =>
  ({ id: ID, title: 'Scan', axes: [{ field: axisField, values: { kind: 'list', values: [0, 10, 20, 30] } }], baseConfig: base, points: [0, 1, 2, 3].map(point) }) as unknown as SweepDetail

const MAP: SensingMapResponse = {
  brillouinShiftGHz: 10.8,
  positionsM: [0, 50, 100],
  detuningsMHz: [0, 10, 20, 30],
  gainLn: [[0.1, 0.2, 0.1, 0.05], [0.05, 0.1, 0.2, 0.1], [0.1, 0.2, 0.1, 0.05]],
  fittedShiftMHz: [10, 20, 10],
  sigmaMHz: [0.3, 0.4, 0.3],
  peakGainLn: [0.2, 0.2, 0.2],
  usable: [true, true, true],
  outsideScan: [false, false, false],
  trueShiftMHz: [10, 20, 10],
  nominalResolutionM: 5.1,
  measuredResolutionM: null,
  resolutionM: 5.1,
  rangeM: 100,
  hotSpots: [
    { segment: 1, startM: 40, endM: 60, trueShiftMHz: 20, fittedShiftMHz: 20.1, sigmaMHz: 0.4, status: 'detected' },
    { segment: 2, startM: 80, endM: 81, trueShiftMHz: 20, fittedShiftMHz: null, sigmaMHz: null, status: 'not resolved' },
  ],
  pointsUsed: 4,
  pointsPending: 0,
  noiseRms: 0.001,
}

describe('SensingMap', () => {
  it('shows resolution, range and each hot spot, says when the resolution is nominal, and links the files', async () => {
    const f = fakeFetch({ [`GET /api/sweeps/${ID}/sensing-map`]: { body: MAP } })
    vi.stubGlobal('fetch', f.fn)
    const { wrapper } = await mountWithApp(SensingMap, { props: { sweep: sweep('detuningMHz') } })
    const text = wrapper.text()
    expect(text).toContain('Sensing map (time-of-flight read-out)')
    expect(text).toContain('no isolated step of at most half the linewidth')
    expect(text).toContain('Detected (within 3σ)')
    expect(text).toContain('Not resolved: shorter than the resolution')
    expect(f.calls[0].url).toContain('noiseRms=0.001')
    const links = [...wrapper.element.querySelectorAll('a')].map((a) => a.getAttribute('href'))
    expect(links.some((h) => h?.includes('format=csv'))).toBe(true)
    expect(links.some((h) => h?.includes('format=npy'))).toBe(true)
  })

  it('sets a measured resolution far from v_g·τ/2 beside the nominal with the reason, and names positions and hot spots outside the scan', async () => {
    const far: SensingMapResponse = {
      ...MAP,
      measuredResolutionM: 0.54,
      nominalResolutionM: 1.02,
      resolutionM: 0.54,
      usable: [true, false, true],
      outsideScan: [false, true, false],
      fittedShiftMHz: [10, null, 10],
      hotSpots: [{ segment: 1, startM: 40, endM: 60, trueShiftMHz: 35, fittedShiftMHz: null, sigmaMHz: null, status: 'outside scan' }],
    }
    vi.stubGlobal('fetch', fakeFetch({ [`GET /api/sweeps/${ID}/sensing-map`]: { body: far } }).fn)
    const { wrapper } = await mountWithApp(SensingMap, { props: { sweep: sweep('detuningMHz') } })
    const note = wrapper.find('[data-testid="sensing-resolution-note"]').text()
    expect(note).toContain('Measured 0.53 × nominal')
    expect(note).toContain('phonon builds up')
    expect(wrapper.find('[data-testid="sensing-outside"]').text()).toContain('1 of 3 positions')
    expect(wrapper.text()).toContain('Outside the scanned range: its gain peak sits on the edge of the scan')
  })

  it('stays out of the way for a sweep that is not a detuning scan', async () => {
    const f = fakeFetch({})
    vi.stubGlobal('fetch', f.fn)
    const { wrapper } = await mountWithApp(SensingMap, { props: { sweep: sweep('pumpPowerW') } })
    expect(wrapper.find('[data-testid="sensing-map"]').exists()).toBe(false)
    expect(f.calls.filter((c) => c.url.includes('sensing-map'))).toHaveLength(0)
  })
})
