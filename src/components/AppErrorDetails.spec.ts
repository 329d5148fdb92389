// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { ApiError } from '@/api/client'
import { mountWithApp } from '@/test-utils/mount'
import SimulationSubmitPanel from './simulation/SimulationSubmitPanel.vue'

afterEach(() => {
  document.body.innerHTML = ''
})

const reasons = [
  'The run needs 4.00e+10 cell-updates, over the limit of 2.00e+10: shorten the window from 1000 ns to ≤ 500 ns.',
  'The run needs about 9.0 GiB of memory, over the limit of 4.0 GiB; keep fewer map rows and columns.',
]

describe('error details where errors are shown', () => {
  it('lists each reason of a refused run on its own line in the submit panel, with no JSON', async () => {
    const error = new ApiError(422, 'over_limit', reasons.join(' '), [], 'req-9', { reasons })
    const { wrapper } = await mountWithApp(SimulationSubmitPanel, { props: { issues: [], channelCount: 1, blockedBy: [], busy: false, error, title: 'Probe', notes: '' } })

    const items = wrapper.findAll('.v-alert li').map((li) => li.text())
    expect(items).toEqual(reasons)
    expect(wrapper.find('.v-alert').text()).not.toMatch(/[{}[\]"]/)
  })

  it('adds the quota’s use under a quota refusal', async () => {
    const error = new ApiError(429, 'quota_runs_in_flight', 'You have reached your quota of runs in flight per user.', [], undefined, { quota: { scope: 'user', limit: 20, used: 20, freesAt: null } })
    const { wrapper } = await mountWithApp(SimulationSubmitPanel, { props: { issues: [], channelCount: 1, blockedBy: [], busy: false, error, title: 'Probe', notes: '' } })

    expect(wrapper.find('.v-alert').text()).toContain('Your quota: 20 of 20 used.')
  })
})
