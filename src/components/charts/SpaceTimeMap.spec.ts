// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { defineComponent, h } from 'vue'
import { mountWithApp } from '@/test-utils/mount'
import { buildLut, cellAt, colourRange, DEFAULT_LUT, MAP_RAMP, paintMap } from './map-colours'

// ECharts needs a real canvas; the map's own painting and readout do not, so the chart is a stand-in here.
vi.mock('@/plugins/echarts', () => ({
  VChart: defineComponent({ props: ['option', 'theme', 'autoresize'], setup: () => () => h('div', { class: 'vchart-stub' }) }),
  chartThemeName: () => 'test',
}))
const { default: SpaceTimeMap } = await import('./SpaceTimeMap.vue')

const rgbaAt = (px: Uint8ClampedArray, i: number) => Array.from(px.subarray(4 * i, 4 * i + 4))
const lutAt = (k: number) => [DEFAULT_LUT[3 * k], DEFAULT_LUT[3 * k + 1], DEFAULT_LUT[3 * k + 2], 255]
const FIRST = [MAP_RAMP[0][1], MAP_RAMP[0][2], MAP_RAMP[0][3], 255]
const LAST = [MAP_RAMP[MAP_RAMP.length - 1][1], MAP_RAMP[MAP_RAMP.length - 1][2], MAP_RAMP[MAP_RAMP.length - 1][3], 255]

afterEach(() => {
  vi.restoreAllMocks()
  document.body.innerHTML = ''
})

describe('map colours', () => {
  it('runs the ramp from its first stop at the bottom to its last at the top, getting lighter all the way', () => {
    const lut = buildLut()
    expect(lutAt(0)).toEqual(FIRST)
    expect(lutAt(255)).toEqual(LAST)
    // Rec. 709 luma weights (ITU-R BT.709): a brighter pixel must always mean a larger value.
    const luma = (k: number) => 0.2126 * lut[3 * k] + 0.7152 * lut[3 * k + 1] + 0.0722 * lut[3 * k + 2]
    for (let k = 1; k < 256; k++) expect(luma(k)).toBeGreaterThanOrEqual(luma(k - 1))
  })

  it('paints a 2 × 2 map linearly from zero to the peak', () => {
    const values = new Float32Array([0, 1, 2, 4])
    const range = colourRange(values, 'linear')
    expect(range).toEqual({ min: 0, max: 4 })
    const px = paintMap(values, 2, 2, range, 'linear')
    expect(rgbaAt(px, 0)).toEqual(FIRST)
    expect(rgbaAt(px, 1)).toEqual(lutAt(Math.round(0.25 * 255)))
    expect(rgbaAt(px, 2)).toEqual(lutAt(Math.round(0.5 * 255)))
    expect(rgbaAt(px, 3)).toEqual(LAST)
  })

  it('paints on a log scale over the chosen decades, clamping below the floor', () => {
    const values = new Float64Array([1e-6, 1e-4, 0.2, 1])
    const range = colourRange(values, 'log', 4)
    expect(range.max).toBe(1)
    expect(range.min).toBeCloseTo(1e-4, 15)
    const log = paintMap(values, 2, 2, range, 'log')
    expect(rgbaAt(log, 0)).toEqual(FIRST) // below the floor
    expect(rgbaAt(log, 1)).toEqual(FIRST) // at the floor
    // 0.2 sits log10(0.2) + 4 = 3.30 of the 4 decades up: LUT entry 210.
    expect(Math.round(((Math.log10(0.2) + 4) / 4) * 255)).toBe(210)
    expect(rgbaAt(log, 2)).toEqual(lutAt(210))
    expect(rgbaAt(log, 3)).toEqual(LAST)
    // On the linear scale the same 0.2 sits a fifth of the way up: the two scales really differ.
    expect(rgbaAt(paintMap(values, 2, 2, colourRange(values, 'linear'), 'linear'), 2)).toEqual(lutAt(51))
  })

  it('leaves rows not yet received transparent and ignores them for the range', () => {
    const values = new Float32Array([1, 2, 100, 100])
    const filled = new Uint8Array([1, 0])
    const range = colourRange(values, 'linear', 4, filled, 2)
    expect(range.max).toBe(2)
    const px = paintMap(values, 2, 2, range, 'linear', filled)
    expect(rgbaAt(px, 1)).toEqual(LAST)
    expect(rgbaAt(px, 2)).toEqual([0, 0, 0, 0])
  })

  it('finds the cell under a point of the plot, and none outside it', () => {
    const rect = { left: 50, top: 10, width: 200, height: 100 }
    expect(cellAt(50, 10, rect, 4, 8)).toEqual({ row: 0, col: 0 })
    expect(cellAt(249.9, 109.9, rect, 4, 8)).toEqual({ row: 3, col: 7 })
    expect(cellAt(151, 61, rect, 4, 8)).toEqual({ row: 2, col: 4 })
    expect(cellAt(49, 50, rect, 4, 8)).toBeNull()
    expect(cellAt(100, 110, rect, 4, 8)).toBeNull()
  })
})

describe('SpaceTimeMap', () => {
  async function mountMap() {
    // Plot = chart width minus the fixed margins (54 left, 10 right) by height minus 8 + 40.
    vi.spyOn(HTMLElement.prototype, 'clientWidth', 'get').mockReturnValue(454)
    const values = new Float32Array([0.001, 0.002, 0.003, 0.004])
    const { wrapper } = await mountWithApp(SpaceTimeMap, {
      props: { title: 'Pump power', units: 'W', values, rows: 2, cols: 2, zRangeM: [0, 0.07], tRangeNs: [0, 6], heightPx: 300 },
    })
    await flushPromises()
    return { wrapper, values }
  }

  it('paints its pixels with the chosen scale and repaints when switched to log', async () => {
    const { wrapper, values } = await mountMap()
    const vm = wrapper.vm as unknown as { pixels: () => Uint8ClampedArray }
    expect(Array.from(vm.pixels())).toEqual(Array.from(paintMap(values, 2, 2, { min: 0, max: 0.004 }, 'linear')))

    await wrapper.findAll('button').find((b) => b.text() === 'Log')!.trigger('click')
    await new Promise((r) => setTimeout(r, 40))
    const log = colourRange(values, 'log', 4)
    expect(Array.from(vm.pixels())).toEqual(Array.from(paintMap(values, 2, 2, log, 'log')))
    expect(rgbaAt(vm.pixels(), 0)).not.toEqual(rgbaAt(paintMap(values, 2, 2, { min: 0, max: 0.004 }, 'linear'), 0))
  })

  it('labels a colour bar whose top is just under 1 µW as 1 µW, not 1000 nW', async () => {
    vi.spyOn(HTMLElement.prototype, 'clientWidth', 'get').mockReturnValue(454)
    const values = new Float32Array([0, 2.5e-7, 5e-7, 9.99e-7])
    const { wrapper } = await mountWithApp(SpaceTimeMap, {
      props: { title: 'Stokes power', units: 'W', values, rows: 2, cols: 2, zRangeM: [0, 0.07], tRangeNs: [0, 6], heightPx: 300 },
    })
    await flushPromises()
    const ticks = wrapper.findAll('.space-time-map__tick').map((t) => t.text())
    expect(ticks).toEqual(['1 µW', '500 nW', '0 W'])
  })

  it('reads out position and value under the pointer, with units', async () => {
    const { wrapper } = await mountMap()
    const chart = wrapper.find('.space-time-map__chart')
    // Plot 390 × 252 px at (54, 8): the lower-left cell is row 1, col 0.
    await chart.trigger('mousemove', { clientX: 54 + 100, clientY: 8 + 200 })
    const text = wrapper.find('[data-testid=map-readout]').text()
    expect(text).toContain('3 mW')
    expect(text).toContain('z 17.5 mm') // centre of the first of two columns over 70 mm
    expect(text).toContain('t 4.5 ns') // centre of the second of two rows over 6 ns

    await chart.trigger('mousemove', { clientX: 10, clientY: 200 })
    expect(wrapper.find('[data-testid=map-readout]').text()).toContain('point at the map')
  })

  it('moves the readout cursor with the arrow keys', async () => {
    const { wrapper } = await mountMap()
    const chart = wrapper.find('.space-time-map__chart')
    await chart.trigger('keydown', { key: 'ArrowRight' }) // from the centre cell (1, 1) → clamped right
    expect(wrapper.find('[data-testid=map-readout]').text()).toContain('4 mW')
    await chart.trigger('keydown', { key: 'ArrowUp' })
    await chart.trigger('keydown', { key: 'ArrowLeft' })
    expect(wrapper.find('[data-testid=map-readout]').text()).toContain('1 mW')
  })
})
