// The rolling-window arithmetic of the daily budget, with charges and answers worked out by hand.
import { describe, expect, it } from 'vitest'
import { checkBudget } from './daily-budget'

const H = 3600 * 1000
const at = (hours: number) => new Date(Date.UTC(2026, 11, 3) + hours * H)
const charges = [
  { at: at(0), cellUpdates: 4e11 },
  { at: at(2), cellUpdates: 3e11 },
  { at: at(5), cellUpdates: 2e11 },
]

describe('checkBudget', () => {
  it('lets a demand through while spent + demand stays within the limit', () => {
    expect(checkBudget(charges, 1e12, 1e11)).toEqual({ fits: true, usedCellUpdates: 9e11 })
  })

  it('names the moment the oldest charges have left the window far enough for the demand', () => {
    // 9e11 spent, 3e11 asked, 1e12 allowed: the 4e11 of hour 0 must leave (5e11 + 3e11 ≤ 1e12): hour 24.
    expect(checkBudget(charges, 1e12, 3e11)).toEqual({ fits: false, usedCellUpdates: 9e11, freesAt: at(24) })
    // 6e11 asked: the hour-2 charge must leave too (2e11 + 6e11 ≤ 1e12): hour 26.
    expect(checkBudget(charges, 1e12, 6e11)).toEqual({ fits: false, usedCellUpdates: 9e11, freesAt: at(26) })
  })

  it('gives no moment for a demand larger than the whole limit', () => {
    expect(checkBudget(charges, 1e12, 2e12)).toEqual({ fits: false, usedCellUpdates: 9e11, freesAt: null })
  })
})
