// @vitest-environment happy-dom
import { afterEach, describe, expect, it } from 'vitest'
import { ApiError } from '@/api/client'
import { mountWithApp } from '@/test-utils/mount'
import SimulationSubmitPanel from './SimulationSubmitPanel.vue'

afterEach(() => {
  document.body.innerHTML = ''
})

const panel = (error: ApiError | null) =>
  mountWithApp(SimulationSubmitPanel, { props: { issues: [], channelCount: 1, blockedBy: [], busy: false, error, title: 'Probe', notes: '' } })

describe('SimulationSubmitPanel', () => {
  it('shows a quota refusal under its own heading with the API’s message and no request id', async () => {
    const message = 'You have reached your quota of runs in flight per user: 20 runs in flight of at most 20. It frees up as soon as one of them finishes or you cancel it.'
    const { wrapper } = await panel(new ApiError(429, 'quota_runs_in_flight', message, [], 'req-123'))

    const alert = wrapper.find('.v-alert')
    expect(alert.text()).toContain('Too many runs in flight')
    expect(alert.text()).toContain(message)
    expect(alert.text()).not.toContain('req-123')
    expect(alert.find('a').attributes('href')).toBe('/runs')
  })

  it('names the daily budget for a 422 quota refusal, and keeps the request id for other errors', async () => {
    const quota = await panel(new ApiError(422, 'quota_cell_updates_per_day', 'This run needs 4.00e+09 cell-updates, but …', [], 'req-1'))
    expect(quota.wrapper.find('.v-alert').text()).toContain('Daily computing quota used up')
    quota.wrapper.unmount()

    const fault = await panel(new ApiError(500, 'internal', 'Something went wrong on our side', [], 'req-2'))
    expect(fault.wrapper.find('.v-alert').text()).toContain('req-2')
    expect(fault.wrapper.find('.v-alert').text()).not.toContain('quota')
  })
})
