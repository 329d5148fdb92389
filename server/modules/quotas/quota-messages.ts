// The words of a quota refusal: which quota, its limit, the current use and when it frees up. Users read
// these in the submit panel, so they name things as the app does (runs, sweeps, cell-updates), nothing internal.
import type { QuotaScope } from './quota-usage.repo'

const cells = (n: number) => (n === 0 ? '0' : n.toExponential(2))

/** "14:05 UTC on 2026-12-04 (in 3 h 12 min)". */
export function describeMoment(at: Date, now: Date): string {
  const iso = at.toISOString()
  const mins = Math.max(1, Math.ceil((at.getTime() - now.getTime()) / 60_000))
  const wait = mins < 60 ? `${mins} min` : `${Math.floor(mins / 60)} h ${mins % 60} min`
  return `${iso.slice(11, 16)} UTC on ${iso.slice(0, 10)} (in ${wait})`
}

export interface InFlightRefusal {
  scope: QuotaScope
  unconfirmed: boolean
  limit: number
  inFlight: number
  /** The confirmed-account quota, named to unconfirmed accounts. */
  confirmedLimit: number
}

const items = (n: number) => `${n} ${n === 1 ? 'run' : 'runs'}`

export function inFlightMessage(r: InFlightRefusal): string {
  const what = 'single runs queued or running, and sweeps not yet finished'
  if (r.scope === 'group') {
    return `Your group has reached its quota of runs in flight per group: ${items(r.inFlight)} in flight of at most ${r.limit} (${what}). ` +
      'It frees up as soon as one of the group’s runs or sweeps finishes or is cancelled.'
  }
  const quota = r.unconfirmed ? 'runs in flight for an account whose email address is not confirmed' : 'runs in flight per user'
  const confirm = r.unconfirmed ? ` Confirm your email address with the link we mailed you to raise the quota to ${r.confirmedLimit}.` : ''
  return `You have reached your quota of ${quota}: ${items(r.inFlight)} in flight of at most ${r.limit} (${what}). ` +
    `It frees up as soon as ${r.inFlight === 1 ? 'it finishes' : 'one of them finishes'} or you cancel it.${confirm}`
}

export interface BudgetRefusal {
  scope: QuotaScope
  unconfirmed: boolean
  what: 'run' | 'sweep'
  limit: number
  used: number
  demand: number
  /** null: the demand alone is over the limit. */
  freesAt: Date | null
  now: Date
  confirmedLimit: number
}

export function budgetMessage(r: BudgetRefusal): string {
  const quota = r.scope === 'group'
    ? 'cell-updates per day per group'
    : r.unconfirmed ? 'cell-updates per day for an account whose email address is not confirmed' : 'cell-updates per day per user'
  const whose = r.scope === 'group' ? 'your group’s' : 'your'
  const confirm = r.scope === 'user' && r.unconfirmed ? ` Confirm your email address with the link we mailed you to raise it to ${cells(r.confirmedLimit)} a day.` : ''
  const needs = `This ${r.what} needs ${cells(r.demand)} cell-updates`
  if (r.freesAt === null) {
    return `${needs}, more than ${whose} whole quota of ${cells(r.limit)} ${quota}. Make it smaller (a shorter window, a coarser time step${r.what === 'sweep' ? ' or fewer points' : ''}).${confirm}`
  }
  const frees = `Enough frees up at ${describeMoment(r.freesAt, r.now)}, as earlier runs leave the 24-hour window.${confirm}`
  // A re-run of failed sweep points asks for nothing up front (its points are charged as they are stored).
  if (r.demand === 0) return `${whose[0].toUpperCase()}${whose.slice(1)} quota of ${cells(r.limit)} ${quota} is used up: ${cells(r.used)} were used in the last 24 hours. ${frees}`
  return `${needs}, but ${whose} quota of ${cells(r.limit)} ${quota} has ${cells(Math.max(0, r.limit - r.used))} left: ${cells(r.used)} were used in the last 24 hours. ` +
    frees
}
