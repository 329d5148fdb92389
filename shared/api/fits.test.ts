import { describe, expect, it } from 'vitest'
import { FitRequest } from './fits'

const ids = { traceId: '6f1c2a4e-8d7b-4c1e-9a57-2b3c4d5e6f70', runId: '0b9a8c7d-6e5f-4a3b-8c2d-1e0f9a8b7c6d' }
const paths = (body: object) => FitRequest.safeParse({ ...ids, ...body }).error?.issues.map((i) => i.path.join('.')) ?? []

describe('FitRequest search ranges', () => {
  it('accepts ranges inside what a run may hold', () => {
    expect(paths({ timeOffsetNs: { min: -2, max: 2 }, free: { linewidthMHz: { min: 5, max: 80 }, pulseWidthScale: { min: 0.5, max: 2 } } })).toEqual([])
  })

  it('refuses ranges whose models or shifted axes would overflow, naming the bound', () => {
    expect(paths({ timeOffsetNs: { min: -1e308, max: 1e308 } })).toEqual(['timeOffsetNs.min', 'timeOffsetNs.max'])
    expect(paths({ timeOffsetNs: { min: -1, max: 1 }, free: { linewidthMHz: { min: 0, max: 1e308 } } })).toEqual(['free.linewidthMHz.min', 'free.linewidthMHz.max'])
    expect(paths({ timeOffsetNs: { min: -1, max: 1 }, free: { pulseWidthScale: { min: 5e-324, max: 3 } } })).toEqual(['free.pulseWidthScale.min'])
  })
})
