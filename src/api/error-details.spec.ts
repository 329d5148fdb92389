// @vitest-environment happy-dom
import { afterEach, describe, expect, it, vi } from 'vitest'
import { api, ApiError } from './client'
import { apiErrorFrom } from './api-error'
import { errorDetailLines } from './error-details'
import { fakeFetch } from '@/test-utils/mount'

afterEach(() => vi.unstubAllGlobals())

const refusal = (code: string, message: string, details: Record<string, unknown>) => apiErrorFrom(422, { error: { code, message, details } })

describe('error details', () => {
  it('keeps the details of the envelope on the ApiError', async () => {
    const { fn } = fakeFetch({ 'POST /api/runs': { status: 422, body: { error: { code: 'over_limit', message: 'Too big.', details: { reasons: ['Too big.'] } } } } })
    vi.stubGlobal('fetch', fn)

    const err = (await api.post('/runs', {}).catch((e: unknown) => e)) as ApiError

    expect(err.details).toEqual({ reasons: ['Too big.'] })
  })

  it('lists several reasons one to a line, and adds nothing for a single one the message already says', () => {
    const two = refusal('over_limit', 'Needs 4e10 cell-updates. Needs 9 GiB.', { reasons: ['Needs 4e10 cell-updates.', 'Needs 9 GiB.'] })
    const one = refusal('over_limit', 'Needs 4e10 cell-updates.', { reasons: ['Needs 4e10 cell-updates.'] })

    expect(errorDetailLines(two)).toEqual(['Needs 4e10 cell-updates.', 'Needs 9 GiB.'])
    expect(errorDetailLines(one)).toEqual([])
  })

  it('states a sweep’s totals against its limit', () => {
    const err = refusal('over_limit', 'Over.', { reasons: ['Over.'], totalCellUpdates: 3.2e11, limitCellUpdates: 2e11, points: 32 })

    expect(errorDetailLines(err)).toEqual(['In total: 3.20e+11 cell-updates over 32 points; the limit for a sweep is 2.00e+11.'])
  })

  it('says where a file is broken unless the message already does', () => {
    expect(errorDetailLines(refusal('unreadable_trace', 'scope.npy: the header is cut short', { where: { byteOffset: 1024 } }))).toEqual(['The problem is at byte 1,024 of the file.'])
    expect(errorDetailLines(refusal('unreadable_trace', 'a.csv: Line 4 has 2 fields', { where: { line: 4 } }))).toEqual([])
  })

  it('states a quota’s use, and never shows details that do not have the declared shape', () => {
    const quota = refusal('quota_runs_in_flight', 'Quota reached.', { quota: { scope: 'group', limit: 5, used: 5, freesAt: null } })
    const odd = refusal('quota_runs_in_flight', 'Quota reached.', { quota: { path: 'config.lengthM' } })

    expect(errorDetailLines(quota)).toEqual(['Group quota: 5 of 5 used.'])
    expect(errorDetailLines(odd)).toEqual([])
    expect(errorDetailLines(new ApiError(500, 'internal', 'Something went wrong'))).toEqual([])
  })
})
