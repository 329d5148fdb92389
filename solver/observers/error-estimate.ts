/*
 * Richardson estimate of each figure's discretisation error from the run (step h) and its companion on
 * the grid with step q·h (q ≈ 2; exactly 2 unless the cell count along z is odd):
 *
 *     f_h = f + C h^p + O(h^{p+1}),  f_qh = f + C (qh)^p + …   ⇒   err(h) = f_h − f ≈ (f_qh − f_h)/(q^p − 1)
 *
 * with p = 2 for this scheme, p = 1 with acoustic advection, whose upwind step is first order (Richardson
 * extrapolation: Hairer, Nørsett & Wanner, Solving Ordinary Differential Equations I, §II.4; Roache,
 * Verification and Validation in Computational Science and Engineering, ch. 5).
 * The step that brings a relative error ε down to a target ε_t follows from the same scaling:
 * h_t = h·(ε_t/ε)^{1/p}.
 *
 * Pure: walks every numeric leaf of the figures generically (paths like "channels.0.reflectivity"), so a
 * figure added later gets its estimate without a change here. Leaves that are settings rather than results
 * (window bounds, indices) or that measure the scheme itself (the photon-balance residual, at round-off)
 * are skipped; a figure that is null in either run gets no estimate.
 */
import { ERROR_ESTIMATE } from '@shared/physics/error-estimate-plan'
import { numericLeaves, type FigureError, type FigureErrors } from '@shared/physics/figure-error'
import type { FiguresOfMerit } from '@shared/physics/simulation-result'

/** Angles: differences are taken modulo 2π and the relative error is against a full turn. */
const isPhase = (key: string) => /PhaseRad$/.test(key)

/** Rounds down to three significant digits, so the suggestion is never coarser than the scaling asks. */
const floor3 = (x: number) => {
  const e = Math.pow(10, Math.floor(Math.log10(x)) - 2)
  return Number((Math.floor(x / e) * e).toPrecision(3))
}

export function figureError(path: string, fine: number, coarse: number, fineDtS: number, coarseDtS: number, p: number = ERROR_ESTIMATE.order): FigureError {
  const q = coarseDtS / fineDtS
  let diff = fine - coarse
  const key = path.slice(path.lastIndexOf('.') + 1)
  if (isPhase(key)) diff = Math.atan2(Math.sin(diff), Math.cos(diff))
  const absError = Math.abs(diff) / (Math.pow(q, p) - 1)
  const scale = isPhase(key) ? 2 * Math.PI : Math.abs(fine)
  const relError = scale > 0 ? absError / scale : absError === 0 ? 0 : null
  const flagged = relError !== null && relError > ERROR_ESTIMATE.flagAboveRelError
  const suggestedTimeStepPs = flagged ? floor3(fineDtS * 1e12 * Math.pow(ERROR_ESTIMATE.targetRelError / relError!, 1 / p)) : null
  return { value: fine, coarseValue: coarse, absError, relError, flagged, suggestedTimeStepPs }
}

/** The estimate for every figure present (finite, non-null) in both runs. */
export function estimateFigureErrors(
  fine: FiguresOfMerit,
  coarse: FiguresOfMerit,
  fineDtS: number,
  coarseDtS: number,
  order: number = ERROR_ESTIMATE.order,
  coarseCellUpdates = 0,
): FigureErrors {
  const a = numericLeaves(fine)
  const b = numericLeaves(coarse)
  const figures: Record<string, FigureError> = {}
  for (const [path, v] of a) {
    const w = b.get(path)
    if (w !== undefined) figures[path] = figureError(path, v, w, fineDtS, coarseDtS, order)
  }
  return { ...common(fineDtS, coarseDtS), order, status: 'estimated', reason: null, cellUpdates: coarseCellUpdates, figures }
}

/** No estimate, with the reason a user reads. */
export function noFigureErrors(status: 'unavailable' | 'off', reason: string, fineDtS: number | null, coarseCellUpdates = 0): FigureErrors {
  return { ...common(fineDtS, null), status, reason, cellUpdates: coarseCellUpdates, figures: {} }
}

function common(fineDtS: number | null, coarseDtS: number | null) {
  return {
    order: ERROR_ESTIMATE.order,
    timeStepPs: fineDtS === null ? null : fineDtS * 1e12,
    coarseTimeStepPs: coarseDtS === null ? null : coarseDtS * 1e12,
    flagAboveRelError: ERROR_ESTIMATE.flagAboveRelError,
    targetRelError: ERROR_ESTIMATE.targetRelError,
  }
}

/** Flagged figures as one run warning, naming the step that would bring them under the target. */
export function flaggedWarning(e: FigureErrors): { code: string; message: string } | null {
  const flagged = Object.values(e.figures).filter((f) => f.flagged)
  if (flagged.length === 0) return null
  const step = Math.min(...flagged.map((f) => f.suggestedTimeStepPs!))
  const worst = Math.max(...flagged.map((f) => f.relError!))
  return {
    code: 'discretisation-error',
    message:
      `${flagged.length} figure${flagged.length > 1 ? 's have' : ' has'} an estimated numerical error above ${100 * e.flagAboveRelError} % ` +
      `(up to ${(100 * worst).toPrecision(2)} %); a time step of ${step.toPrecision(3)} ps or less brings ${flagged.length > 1 ? 'them' : 'it'} under ${100 * e.targetRelError} %.`,
  }
}
