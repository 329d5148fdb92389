// The daily cell-update budget over a rolling window: what is spent, whether a new demand fits, and, when it
// does not, the moment enough of the spending has left the window for it to fit.
//
//   used(t) = Σ c_k over charges with t − W < t_k ≤ t;   the demand d fits at t when used(t) + d ≤ L
//
// Charges only leave as time passes, so the first fitting moment is when the oldest charges up to some k have
// left: t = t_k + W for the smallest k with used − Σ_{j≤k} c_j + d ≤ L.
import type { Charge } from './quota-usage.repo'

/** The budget's window: a rolling 24 hours. */
export const BUDGET_WINDOW_S = 24 * 3600

export type BudgetCheck =
  | { fits: true; usedCellUpdates: number }
  | { fits: false; usedCellUpdates: number; freesAt: Date | null }

/** `charges` oldest first, as quota-usage.repo.ts returns them; freesAt is null when the demand alone is over the limit. */
export function checkBudget(charges: Charge[], limit: number, demand: number, windowS = BUDGET_WINDOW_S): BudgetCheck {
  const used = charges.reduce((s, c) => s + c.cellUpdates, 0)
  if (used + demand <= limit) return { fits: true, usedCellUpdates: used }
  if (demand > limit) return { fits: false, usedCellUpdates: used, freesAt: null }
  let left = used
  for (const c of charges) {
    left -= c.cellUpdates
    if (left + demand <= limit) return { fits: false, usedCellUpdates: used, freesAt: new Date(c.at.getTime() + windowS * 1000) }
  }
  // Only rounding gets here (with every charge gone, left = 0 and demand ≤ limit): the last charge's exit.
  const last = charges[charges.length - 1]
  return { fits: false, usedCellUpdates: used, freesAt: last ? new Date(last.at.getTime() + windowS * 1000) : null }
}
