import { describe, expect, it } from 'vitest'
import { runProgressLabel } from './run-progress'

describe('the progress line of a running run', () => {
  it('counts map rows while the run itself computes', () => {
    expect(runProgressLabel(0.4, 256, 512, 0.8)).toBe('40 % · 256 of 512 map rows')
    expect(runProgressLabel(0.004, 2, 512, 0.8)).toBe('0.4 % · 2 of 512 map rows')
  })

  it('says the error estimate is computing once the run’s share is done, not "512 of 512 map rows"', () => {
    expect(runProgressLabel(0.8, 512, 512, 0.8)).toBe('80 % · computing the error estimate')
    expect(runProgressLabel(0.93, 512, 512, 0.8)).toBe('93 % · computing the error estimate')
  })

  it('never mentions an error estimate for a run without one', () => {
    expect(runProgressLabel(0.999, 512, 512, 1)).toBe('100 % · 512 of 512 map rows')
  })
})
