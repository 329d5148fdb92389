// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { defineComponent, h } from 'vue'
import { SimulationConfig } from '@shared/physics/simulation-config'
import type { SensingMapResponse } from '@shared/api/sensing-map'
import type { SweepDetail } from '@shared/api/sweeps'
import { fakeFetch, mountWithApp } from '@/test-utils/mount'
import SensingMap from './SensingMap.vue'

vi.mock('@/plugins/echarts', () => ({
  VChart: defineComponent({ props: ['option', 'theme', 'autoresize'], setup: () => () => h('div', { class: 'vchart-stub' }) }),
  chartThemeName: () => 'light',
}))

afterEach(() => {
  vi.unstubAllGlobals()
  document.body.innerHTML = ''
})

const ID = '00000000-0000-4000-8000-000000000002'
const modulation = { rateMHz: 8, excursionMHz: 100 }
const base = (lengthM: number) =>
  SimulationConfig.parse({
    waveguide: { name: 'Fibre', lengthM, groupIndex: 1.468, effectiveAreaUm2: 80, gainCoefficientMPerW: 5e-11, brillouinShiftGHz: 10.8, linewidthMHz: 30 },
    channels: [{ pump: { backgroundPowerW: 0.1, modulation }, stokes: { backgroundPowerW: 1e-4, modulation } }],
    windowNs: 400,
  })
const point = (i: number) => ({ index: i, values: [i, i], runId: ID, status: 'succeeded', progress: 1, attempt: 0, error: null, startedAt: null, finishedAt: null, metrics: {} })
const sweep = (lengthM: number, finished: number) =>
  ({
    id: ID,
    title: 'Correlation scan',
    axes: [
      { field: 'detuningMHz', values: { kind: 'linear', start: -60, stop: 90, count: 8 } },
      { field: 'modulationDelayNs', values: { kind: 'linear', start: -40, stop: 40, count: 2 } },
    ],
    baseConfig: base(lengthM),
    points: Array.from({ length: 16 }, (_, i) => ({ ...point(i), status: i < finished ? 'succeeded' : 'queued' })),
  }) as unknown as SweepDetail

const MAP: SensingMapResponse = {
  readOut: 'correlation',
  brillouinShiftGHz: 10.8,
  positionsM: [1, 5, 9],
  detuningsMHz: [-60, -40, -20, 0, 20, 40, 60, 90],
  gainLn: [0, 1, 2].map(() => [0.1, 0.12, 0.15, 0.2, 0.15, 0.12, 0.1, 0.09]),
  fittedShiftMHz: [0, 20, 0],
  sigmaMHz: [0.3, 0.4, 0.3],
  peakGainLn: [0.1, 0.1, 0.1],
  usable: [true, true, true],
  outsideScan: [false, false, false],
  trueShiftMHz: [0, 20, 0],
  nominalResolutionM: 1.22,
  measuredResolutionM: 0.53,
  resolutionM: 1.22,
  peakSpacingM: 12.76,
  rangeStartM: 1,
  rangeM: 8,
  hotSpots: [
    { segment: 1, startM: 4, endM: 7, trueShiftMHz: 20, fittedShiftMHz: 20.1, sigmaMHz: 0.4, status: 'detected' },
    { segment: 2, startM: 9.5, endM: 9.8, trueShiftMHz: 20, fittedShiftMHz: null, sigmaMHz: null, status: 'outside range' },
  ],
  pointsUsed: 16,
  pointsPending: 0,
  noiseRms: 0.001,
}

describe('SensingMap, correlation read-out', () => {
  it('names the read-out, gives both resolutions, the peak spacing and the range read, and says why a hot spot has no figure', async () => {
    vi.stubGlobal('fetch', fakeFetch({ [`GET /api/sweeps/${ID}/sensing-map`]: { body: MAP } }).fn)
    const { wrapper } = await mountWithApp(SensingMap, { props: { sweep: sweep(10, 16) } })
    const text = wrapper.text()
    expect(text).toContain('Sensing map (correlation read-out)')
    expect(text).toContain('Stokes modulation delay')
    expect(text).toContain('Hotate & Hasegawa')
    expect(wrapper.find('[data-testid="correlation-step-width"]').text()).toContain('0.43 × Δz')
    expect(text).toContain('Peak spacing (unambiguous range)')
    expect(text).toContain('12.8 m')
    expect(wrapper.find('[data-testid="correlation-several-peaks"]').exists()).toBe(false)
    expect(text).toContain('Detected (within 3σ)')
    expect(text).toContain('Outside the range read: no modulation delay puts the correlation peak on it')
    expect(text).not.toMatch(/v_g·τ\/2/)
  })

  it('warns when the fibre is longer than the peak spacing, and waits for 16 finished points', async () => {
    vi.stubGlobal('fetch', fakeFetch({ [`GET /api/sweeps/${ID}/sensing-map`]: { body: MAP } }).fn)
    const { wrapper } = await mountWithApp(SensingMap, { props: { sweep: sweep(30, 16) } })
    expect(wrapper.find('[data-testid="correlation-several-peaks"]').text()).toContain('further correlation peaks')
    const f = fakeFetch({})
    vi.stubGlobal('fetch', f.fn)
    const { wrapper: early } = await mountWithApp(SensingMap, { props: { sweep: sweep(10, 10) } })
    expect(early.text()).toContain('The map appears once 16 points have finished (10 so far)')
    expect(f.calls).toHaveLength(0)
  })
})
