/*
 * Fitting a run's model to a measured trace.
 *
 * Residual r_i = y_i − s·m(t_i − t₀; θ): y the measurement in the window, m the model's output power
 * (linearly interpolated, zero outside the model record), t₀ the time offset, s the amplitude scale and
 * θ the freed physical parameters. With no θ the fit is closed form (trace-align.ts: linear least squares
 * for s inside a scan + golden-section search for t₀). With θ, Levenberg–Marquardt (ml-levenberg-marquardt)
 * varies [t₀, s, θ], each new θ one solver run (cached, so steps in t₀ and s cost nothing), started from
 * the closed-form alignment at the run's own θ. Parameters are scaled to order one for the optimiser:
 * positive ones by their starting value, the detuning by the starting linewidth.
 * Uncertainties: covariance = s²(JᵀJ)⁻¹ from a central-difference Jacobian in physical units at the optimum.
 * Models with and without the higher-order acoustic term are compared by residual, AIC and BIC.
 */
import { levenbergMarquardt } from 'ml-levenberg-marquardt'
import type { FitModelResult, FitParameterValue, FitRequest, FitResult, PhysicalFitParameter } from '@shared/api/fits'
import { PHYSICAL_FIT_PARAMETERS } from '@shared/api/fits'
import { informationCriteria, parameterSigmas } from '@shared/analysis/least-squares'
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { alignClosedForm, medianStep, shiftedModel, windowIndices, type Series } from '@shared/analysis/trace-align'
import { baseValues, evaluateModel, pinnedStepPs, variantConfig, type PhysicalValues } from './fit-model'

export interface FitInputs {
  request: FitRequest
  config: SimulationConfig
  measured: Series
  signalUnit: 'W' | 'arb'
  /** The run's stored output power; saves a solver run when the variant is the run itself. */
  runModel?: Series
}

export interface FitHooks {
  onProgress?: (fraction: number, message: string) => void
  shouldAbort?: () => boolean
}

/** Points kept in the stored curves. */
const CURVE_POINTS = 2000
/** Relative step of the finite-difference Jacobian for physical parameters (scaled units). */
const PHYS_STEP = 2e-3
/** Cached model evaluations per variant (LM revisits the last few θ). */
const CACHE_SIZE = 16

export class FitAborted extends Error {}

function defaultWindow(req: FitRequest, measured: Series): { startNs: number; endNs: number } {
  const t = measured.timeNs
  return req.window ?? { startNs: t[0], endNs: t[t.length - 1] }
}

function curveOf(measured: Series, idx: number[], model: Float64Array, scale: number): FitModelResult['curve'] {
  const step = Math.max(1, Math.ceil(idx.length / CURVE_POINTS))
  const curve = { timeNs: [] as number[], model: [] as number[], measured: [] as number[] }
  for (let k = 0; k < idx.length; k += step) {
    curve.timeNs.push(measured.timeNs[idx[k]])
    curve.model.push(scale * model[k])
    curve.measured.push(measured.values[idx[k]])
  }
  return curve
}

function param(name: FitParameterValue['name'], value: number, sigma: number | null, initial: number, min: number | null, max: number | null): FitParameterValue {
  const span = min !== null && max !== null ? max - min : Math.abs(value) || 1
  const atBound = (min !== null && value - min <= 1e-6 * span) || (max !== null && max - value <= 1e-6 * span)
  return { name, value, uncertainty: sigma, initial, min, max, atBound }
}

/** The measured samples inside the fit window. */
function fitWindow(req: FitRequest, measured: Series) {
  const window = defaultWindow(req, measured)
  const idx = windowIndices(measured.timeNs, window.startNs, window.endNs)
  if (idx.length < 8) throw new Error(`The fit window ${window.startNs}–${window.endNs} ns holds ${idx.length} measured samples; at least 8 are needed`)
  return { window, idx, y: Float64Array.from(idx, (i) => measured.values[i]) }
}

/** Counts model evaluations against the run's budget, reports progress and honours a stop. */
function evaluationCounter(budget: number, hooks: FitHooks) {
  const counter = {
    count: 0,
    tick(what: string) {
      if (hooks.shouldAbort?.()) throw new FitAborted('The fit was stopped')
      counter.count++
      hooks.onProgress?.(Math.min(0.99, counter.count / budget), `Model evaluation ${counter.count} of at most ${budget} (${what})`)
    },
  }
  return counter
}

interface VariantContext {
  inputs: FitInputs
  freed: PhysicalFitParameter[]
  base: ReturnType<typeof baseValues>
  window: { startNs: number; endNs: number }
  idx: number[]
  y: Float64Array
  counter: ReturnType<typeof evaluationCounter>
}

/** The model output for physical values θ of one variant, cached (LM revisits the last few θ); the run's own output when θ is the run's. */
function cachedModel(c: VariantContext, higherOrder: boolean): (values: PhysicalValues) => Series {
  const { inputs, freed, base } = c
  const { request: req, config } = inputs
  const label = higherOrder ? 'higher-order term on' : 'higher-order term off'
  const stepPs = pinnedStepPs(config, higherOrder)
  const cache = new Map<string, Series>()
  return (values) => {
    const key = JSON.stringify(freed.map((p) => values[p]))
    const hit = cache.get(key)
    if (hit) return hit
    let series: Series
    if (inputs.runModel && higherOrder === config.options.higherOrderAcoustic && freed.every((p) => values[p] === base[p])) series = inputs.runModel
    else {
      c.counter.tick(label)
      series = evaluateModel(variantConfig(config, values, higherOrder, stepPs), req.port, req.channel)
    }
    if (cache.size >= CACHE_SIZE) cache.delete(cache.keys().next().value!)
    cache.set(key, series)
    return series
  }
}

type Alignment = ReturnType<typeof alignClosedForm>

/** No physics freed: offset and scale in closed form are the fit. */
function closedFormResult(c: VariantContext, higherOrder: boolean, start: Series, aligned: Alignment, evaluationsBefore: number): FitModelResult {
  const { inputs, idx } = c
  const req = inputs.request
  const m = shiftedModel(start, inputs.measured.timeNs, idx, aligned.offsetNs)
  return {
    higherOrderAcoustic: higherOrder,
    parameters: [
      param('timeOffsetNs', aligned.offsetNs, aligned.offsetUncertaintyNs, aligned.offsetNs, req.timeOffsetNs.min, req.timeOffsetNs.max),
      param('scale', aligned.scale, aligned.scaleUncertainty, aligned.scale, null, null),
    ],
    residualNorm: Math.sqrt(aligned.ssr),
    rmsResidual: Math.sqrt(aligned.ssr / idx.length),
    points: idx.length,
    freeParameters: 2,
    aic: aligned.aic,
    bic: aligned.bic,
    evaluations: c.counter.count - evaluationsBefore,
    iterations: 0,
    curve: curveOf(inputs.measured, idx, m, aligned.scale),
  }
}

/** Jacobian columns of the residual in physical units at the optimum x, by central differences. */
function jacobianColumns(
  c: VariantContext,
  modelAt: (values: PhysicalValues) => Series,
  toPhysical: (x: number[]) => PhysicalValues,
  unit: (p: PhysicalFitParameter) => number,
  x: number[],
  best: Series,
  m: Float64Array,
  dtModel: number,
): Float64Array[] {
  const { measured } = c.inputs
  const offsetNs = x[0]
  const scale = x[1]
  const columns: Float64Array[] = []
  const hT = dtModel / 2
  const mA = shiftedModel(best, measured.timeNs, c.idx, offsetNs - hT)
  const mB = shiftedModel(best, measured.timeNs, c.idx, offsetNs + hT)
  columns.push(Float64Array.from(m, (_, k) => (scale * (mA[k] - mB[k])) / (2 * hT)))
  columns.push(Float64Array.from(m, (v) => -v))
  c.freed.forEach((p, k) => {
    const h = PHYS_STEP * Math.max(Math.abs(x[2 + k]), 1e-3)
    const up = [...x]
    const down = [...x]
    up[2 + k] += h
    down[2 + k] -= h
    const mu = shiftedModel(modelAt(toPhysical(up)), measured.timeNs, c.idx, offsetNs)
    const md = shiftedModel(modelAt(toPhysical(down)), measured.timeNs, c.idx, offsetNs)
    columns.push(Float64Array.from(m, (_, i) => (-scale * (mu[i] - md[i])) / (2 * h * unit(p))))
  })
  return columns
}

/** Physics freed: Levenberg–Marquardt over [t₀, s, θ] from the closed-form alignment, then 1σ from the Jacobian. */
function levenbergMarquardtResult(c: VariantContext, higherOrder: boolean, modelAt: (values: PhysicalValues) => Series, start: Series, aligned: Alignment, evaluationsBefore: number): FitModelResult {
  const { inputs, freed, base, idx, y } = c
  const { request: req, measured } = inputs
  // Scaled parameter vector: [t₀ (ns), s/s₀, θ_k/θ_k0 or Δ/Δν₀].
  const s0 = aligned.scale !== 0 ? aligned.scale : 1
  const unit = (p: PhysicalFitParameter) => (p === 'detuningMHz' ? base.linewidthMHz : base[p])
  const toPhysical = (x: number[]): PhysicalValues => Object.fromEntries(freed.map((p, k) => [p, x[2 + k] * unit(p)]))
  const yScale = Math.max(1e-300, ...y.map(Math.abs))
  const yNorm = Float64Array.from(y, (v) => v / yScale)
  const xIndex = Float64Array.from(idx, (_, k) => k)
  const parameterized = (x: number[]) => {
    const m = shiftedModel(modelAt(toPhysical(x)), measured.timeNs, idx, x[0])
    const s = (x[1] * s0) / yScale
    return (k: number) => s * m[k]
  }
  const initial = [aligned.offsetNs, 1, ...freed.map((p) => base[p] / unit(p))]
  const mins = [req.timeOffsetNs.min, -Infinity, ...freed.map((p) => req.free[p]!.min / unit(p))]
  const maxs = [req.timeOffsetNs.max, Infinity, ...freed.map((p) => req.free[p]!.max / unit(p))]
  for (let k = 2; k < initial.length; k++) initial[k] = Math.min(maxs[k], Math.max(mins[k], initial[k]))
  const dtModel = medianStep(start.timeNs)
  const lm = levenbergMarquardt({ x: xIndex, y: yNorm }, parameterized, {
    initialValues: initial,
    minValues: mins,
    maxValues: maxs,
    gradientDifference: [dtModel / 2, 1e-4, ...freed.map(() => PHYS_STEP)],
    damping: 1e-2,
    maxIterations: req.maxIterations,
    errorTolerance: 1e-12 * idx.length,
  })
  const x = lm.parameterValues
  const best = modelAt(toPhysical(x))
  const offsetNs = x[0]
  const scale = x[1] * s0
  const m = shiftedModel(best, measured.timeNs, idx, offsetNs)
  let ssr = 0
  for (let k = 0; k < idx.length; k++) ssr += (y[k] - scale * m[k]) ** 2

  const columns = jacobianColumns(c, modelAt, toPhysical, unit, [offsetNs, scale, ...x.slice(2)], best, m, dtModel)
  const sigmas = parameterSigmas(columns, ssr, idx.length)
  const k = 2 + freed.length
  const physical = toPhysical(x)
  return {
    higherOrderAcoustic: higherOrder,
    parameters: [
      param('timeOffsetNs', offsetNs, sigmas[0], aligned.offsetNs, req.timeOffsetNs.min, req.timeOffsetNs.max),
      param('scale', scale, sigmas[1], aligned.scale, null, null),
      ...freed.map((p, j) => param(p, physical[p]!, sigmas[2 + j], base[p], req.free[p]!.min, req.free[p]!.max)),
    ],
    residualNorm: Math.sqrt(ssr),
    rmsResidual: Math.sqrt(ssr / idx.length),
    points: idx.length,
    freeParameters: k,
    ...informationCriteria(ssr, idx.length, k),
    evaluations: c.counter.count - evaluationsBefore,
    iterations: lm.iterations,
    curve: curveOf(measured, idx, m, scale),
  }
}

/** One model variant (higher-order term on or off): start at the run's θ, align, then fit. */
function fitVariant(c: VariantContext, higherOrder: boolean): FitModelResult {
  const { inputs, window } = c
  const req = inputs.request
  const evaluationsBefore = c.counter.count
  const modelAt = cachedModel(c, higherOrder)
  const start = modelAt(c.base)
  const aligned = alignClosedForm(inputs.measured, start, { ...window, offsetMinNs: req.timeOffsetNs.min, offsetMaxNs: req.timeOffsetNs.max })
  if (c.freed.length === 0) return closedFormResult(c, higherOrder, start, aligned, evaluationsBefore)
  return levenbergMarquardtResult(c, higherOrder, modelAt, start, aligned, evaluationsBefore)
}

/** The preferred model (lowest BIC) and, when both variants ran, their differences. */
function compareModels(models: FitModelResult[]) {
  let preferred = 0
  models.forEach((m, i) => (m.bic < models[preferred].bic ? (preferred = i) : undefined))
  const on = models.find((m) => m.higherOrderAcoustic)
  const off = models.find((m) => !m.higherOrderAcoustic)
  const comparison = on && off ? { deltaAic: on.aic - off.aic, deltaBic: on.bic - off.bic, deltaResidualNorm: on.residualNorm - off.residualNorm } : null
  return { preferred, comparison }
}

export function runFit(inputs: FitInputs, hooks: FitHooks = {}): FitResult {
  const { request: req, config, measured } = inputs
  const { window, idx, y } = fitWindow(req, measured)
  const variants = req.higherOrder === 'compare' ? [false, true] : req.higherOrder === 'asRun' ? [config.options.higherOrderAcoustic] : [req.higherOrder === 'on']
  const freed = PHYSICAL_FIT_PARAMETERS.filter((p) => req.free[p] !== undefined)
  // Budget for progress: per variant one start, per iteration 1 + |θ| evaluations, and 2|θ| at the end.
  const perVariant = freed.length === 0 ? 1 : 1 + req.maxIterations * (1 + freed.length) + 2 * freed.length
  const counter = evaluationCounter(variants.length * perVariant, hooks)
  const context: VariantContext = { inputs, freed, base: baseValues(config), window, idx, y, counter }
  const models = variants.map((higherOrder) => fitVariant(context, higherOrder))
  const { preferred, comparison } = compareModels(models)
  hooks.onProgress?.(1, `Done after ${counter.count} model evaluations`)
  return { method: freed.length === 0 ? 'closedForm' : 'levenbergMarquardt', signalUnit: inputs.signalUnit, window, models, preferred, comparison }
}
