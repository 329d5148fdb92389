// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { flushPromises } from '@vue/test-utils'
import { defineComponent, h } from 'vue'
import { mountWithApp } from '@/test-utils/mount'
import type { ChannelTraces } from '@/composables/useRun'
import { powerSpectrum, type PortSpectrum } from '@shared/analysis/power-spectrum'
import { buildSpectrumOptions, frequencyUnit, occupiedRange } from './spectrum-options'
import RunSpectra from './RunSpectra.vue'

vi.mock('@/plugins/echarts', () => ({
  VChart: defineComponent({ props: ['option', 'theme', 'autoresize'], setup: () => () => h('div', { class: 'vchart-stub' }) }),
  chartThemeName: () => 'light',
}))

afterEach(() => {
  document.body.innerHTML = ''
})

const N = 2000
const DT_NS = 0.01
/** A tone 2 GHz above the carrier: envelope e^{−i2πδt} under the exp(−iωt) convention of docs/model.md. */
function tone(powerW: number, offsetHz: number): Float64Array {
  const a = new Float64Array(2 * N)
  for (let k = 0; k < N; k++) {
    const ph = -2 * Math.PI * offsetHz * k * DT_NS * 1e-9
    a[2 * k] = Math.sqrt(powerW) * Math.cos(ph)
    a[2 * k + 1] = Math.sqrt(powerW) * Math.sin(ph)
  }
  return a
}
const traces = (): ChannelTraces => ({
  timeNs: Float64Array.from({ length: N }, (_, k) => k * DT_NS),
  ports: { pump_in: tone(1e-3, 2e9), stokes_in: new Float64Array(2 * N), pump_out: tone(1e-3, 2e9), stokes_out: tone(1e-6, 0) },
})

async function render() {
  const Host = defineComponent({ setup: () => () => h(RunSpectra, { traces: traces() }) })
  const { wrapper } = await mountWithApp(Host)
  await vi.waitFor(() => expect(wrapper.text()).not.toContain('Computing the spectrum'))
  return wrapper
}

describe('run spectra panel', () => {
  it('states the window and the resolution bandwidth under the plot', async () => {
    const w = await render()
    const caption = w.find('[data-testid="spectrum-rbw"]').text()
    // 2000 samples of 10 ps, lit at the ends: 512-sample segments (5.12 ns), RBW 1.5/5.12 ns = 293 MHz (Hann ENBW,
    // Harris 1978, Proc. IEEE 66, 51), transformed on 2048 points: drawn every 1/20.48 ns = 48.8 MHz.
    expect(caption).toContain('Hann window, 512-sample segments overlapping 75 %')
    expect(caption).toContain('resolution bandwidth 293 MHz (1.5 × 1/segment duration), drawn every 48.8 MHz')
    expect(caption).toContain('Light at the record ends, so the segments lie inside it.')
  })

  it('says there is no light at a dark port instead of plotting −∞', async () => {
    const w = await render()
    await w.findAll('button').find((b) => b.text() === 'Stokes in (z = L)')!.trigger('click')
    await vi.waitFor(() => expect(w.find('[data-testid="spectrum-dark"]').exists()).toBe(true))
    expect(w.text()).toContain('No light at this port')
    expect(w.find('[data-testid="spectrum-rbw"]').exists()).toBe(false)
    await flushPromises()
  })
})

describe('spectrum chart options', () => {
  const s = powerSpectrum(tone(1e-3, 2e9), DT_NS * 1e-9) as PortSpectrum

  it('draws dBm/GHz against the offset in GHz for a ±50 GHz span, the tone at +2 GHz', () => {
    const o = buildSpectrumOptions(s)
    expect(o.xAxis.name).toBe('Offset from the carrier (GHz)')
    expect(o.yAxis.name).toBe('PSD (dBm/GHz)')
    const data = o.series[0].data as number[][]
    const peak = data.reduce((b, p) => (p[1] > b[1] ? p : b))
    expect(peak[0]).toBeCloseTo(2, 1)
    expect(o.yAxis.max).toBeGreaterThanOrEqual(peak[1])
    expect(o.yAxis.min).toBe(Math.floor((s.peakDbmPerGHz - 100) / 10) * 10)
    expect(o.xAxis.axisLabel.formatter(-3.6955717318775614)).toBe('-3.7')
  })

  it('opens on the occupied band around the tone', () => {
    const [lo, hi] = occupiedRange(s)
    expect(s.offsetHz[lo]).toBeLessThan(2e9)
    expect(s.offsetHz[hi]).toBeGreaterThan(2e9)
    expect(hi - lo).toBeLessThan(s.offsetHz.length / 2)
  })

  it('picks MHz for spans of a few MHz and GHz from 2 GHz', () => {
    expect(frequencyUnit(5e6).unit).toBe('MHz')
    expect(frequencyUnit(5e9).unit).toBe('GHz')
    expect(frequencyUnit(5e3).unit).toBe('kHz')
  })
})
