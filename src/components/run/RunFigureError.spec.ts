// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import type { FigureErrors } from '@shared/physics/figure-error'
import { mountWithApp } from '@/test-utils/mount'
import RunErrorEstimateNote from './RunErrorEstimateNote.vue'
import RunFigureError from './RunFigureError.vue'

afterEach(() => {
  document.body.innerHTML = ''
})

const estimate = (over: Partial<FigureErrors> = {}): FigureErrors => ({
  status: 'estimated',
  reason: null,
  order: 2,
  timeStepPs: 19.4,
  coarseTimeStepPs: 38.8,
  flagAboveRelError: 0.01,
  targetRelError: 0.001,
  cellUpdates: 1000,
  figures: {
    'channels.0.peakStokesGainDb': { value: 0.4177, coarseValue: 0.4, absError: 0.0059, relError: 0.0142, flagged: true, suggestedTimeStepPs: 10.2 },
    'channels.0.energyJ.pumpIn': { value: 5.3e-12, coarseValue: 5.3e-12, absError: 5.4e-28, relError: 1.02e-16, flagged: false, suggestedTimeStepPs: null },
    'channels.0.energyJ.stokesOut': { value: 2e-9, coarseValue: 2.00009e-9, absError: 3e-14, relError: 1.5e-5, flagged: false, suggestedTimeStepPs: null },
  },
  ...over,
})

describe('RunFigureError', () => {
  it('shows ± the estimated error in the figure’s unit, with no flag under 1 %', async () => {
    const { wrapper } = await mountWithApp(RunFigureError, { props: { estimate: estimate(), path: 'channels.0.energyJ.stokesOut', unit: 'J' } })
    expect(wrapper.text()).toBe('± 30 fJ')
    expect(wrapper.find('[title]').attributes('title')).toBe('Estimated numerical error, 0.0015 % of the value')
    expect(wrapper.find('[aria-label]').exists()).toBe(false)
  })

  it('says "exact to round-off" rather than a noise-sized number when the estimate is below 1e-12 of the value', async () => {
    const { wrapper } = await mountWithApp(RunFigureError, { props: { estimate: estimate(), path: 'channels.0.energyJ.pumpIn', unit: 'J' } })
    expect(wrapper.text()).toBe('exact to round-off')
    expect(wrapper.text()).not.toContain('e-28')
    expect(wrapper.find('[title]').attributes('title')).toMatch(/same value to within round-off/)
  })

  it('flags a figure over 1 % and names the step that brings it under 0.1 %', async () => {
    const { wrapper } = await mountWithApp(RunFigureError, { props: { estimate: estimate(), path: 'channels.0.peakStokesGainDb', unit: 'dB' } })
    expect(wrapper.text()).toContain('± 0.0059')
    const flag = wrapper.find('[aria-label]')
    expect(flag.attributes('aria-label')).toBe('Estimated numerical error 1.4 %, above 1 %. A time step of 10.2 ps or less brings it under 0.1 %.')
  })

  it('shows nothing for a figure without an estimate, or when the run has none', async () => {
    const a = await mountWithApp(RunFigureError, { props: { estimate: estimate(), path: 'channels.0.retrievalEfficiency', unit: 'fraction' } })
    expect(a.wrapper.text()).toBe('')
    a.wrapper.unmount()
    const b = await mountWithApp(RunFigureError, { props: { estimate: estimate({ status: 'off', figures: {} }), path: 'channels.0.peakStokesGainDb', unit: 'dB' } })
    expect(b.wrapper.text()).toBe('')
  })
})

describe('RunErrorEstimateNote', () => {
  it('says what ± means, with both steps, and warns about flagged figures', async () => {
    const { wrapper } = await mountWithApp(RunErrorEstimateNote, { props: { estimate: estimate() } })
    expect(wrapper.text()).toContain('twice the time step (38.8 ps instead of 19.4 ps)')
    expect(wrapper.find('.v-alert').text()).toContain('1 figure (flagged) has an estimated error above 1 %. A time step of 10.2 ps or less brings it under 0.1 %.')
  })

  it('gives the reason when there is no estimate', async () => {
    const reason = 'No error estimate for runs with thermal noise: a grid with twice the step draws a different random field, so the difference would measure the noise, not the grid.'
    const { wrapper } = await mountWithApp(RunErrorEstimateNote, { props: { estimate: estimate({ status: 'unavailable', reason, figures: {}, coarseTimeStepPs: null }) } })
    expect(wrapper.text()).toContain(reason)
    expect(wrapper.find('.v-alert').exists()).toBe(false)
  })
})
