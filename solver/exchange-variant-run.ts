// A run advanced with one of the research variants of the local step (steppers/exchange-variants.ts),
// for the error-constant benchmark and its tests only: users never reach it. It uses SimulationRun for the
// model, state, inputs and figures, and repeats the driver's time loop for the one-channel SVEA case on the
// TypeScript path (interaction, port recording, exact transport, boundary inputs, and the storage runs'
// companion without the read pulse, forked at the same step as the driver forks it). With the default
// variant it gives the driver's numbers bit for bit (tests/solver/exchange-variants.test.ts).
import type { SimulationConfig } from '@shared/physics/simulation-config'
import { chooseGrid, type GridChoice } from '@shared/physics/grid-step'
import { SimulationRun } from './driver'
import { computeFigures } from './observers/figures-of-merit'
import { planStorageReference } from './storage-reference'
import { fastPathApplies } from './steppers/interaction-kernel'
import { flushTiny, flushValue } from './steppers/subnormal-flush'
import { interactSveaVariant, meanCoefficients, type MeanCoefficients, type StepVariant } from './steppers/exchange-variants'

export interface VariantResult {
  run: SimulationRun
  reference: SimulationRun | null
  figures: ReturnType<typeof computeFigures>
  /** Wall time of the time loop alone (s). */
  seconds: number
  /** Node-steps done, the storage companion's included. */
  cellUpdates: number
}

export function runVariant(config: SimulationConfig, variant: StepVariant, grid: GridChoice = chooseGrid(config)): VariantResult {
  const run = new SimulationRun(config, grid, { engine: 'ts', threads: 1 })
  const m = run.model
  if (run.profile || !fastPathApplies(m) || m.advectionCourant > 0) throw new Error('The step variants cover the one-channel SVEA case without Kerr, noise, acoustic advection or sections')
  const mean = variant.average !== 'trapezoid' ? meanCoefficients(m.svea.eRe, m.svea.eIm, m.dtS) : null
  const plan = planStorageReference(config, m.dtS)
  let reference: SimulationRun | null = null
  const t0 = performance.now()
  for (let n = 0; n <= m.nt; n++) {
    if (plan && n === plan.forkN) reference = fork(run, plan.config, grid, n)
    step(run, n, variant, mean)
    if (reference) step(reference, n, variant, mean)
  }
  const seconds = (performance.now() - t0) / 1000
  const cellUpdates = (m.nt + 1 + (reference ? m.nt + 1 - plan!.forkN : 0)) * m.nodes
  const figures = computeFigures(config, m, run.traces, run.leftInside(), seconds, cellUpdates, reference?.traces ?? null)
  return { run, reference, figures, seconds, cellUpdates }
}

/** The companion without the read pulse, continuing from the run's state at time index n (as the driver's fork). */
function fork(run: SimulationRun, config: SimulationConfig, grid: GridChoice, n: number): SimulationRun {
  const c = new SimulationRun(config, grid, { engine: 'ts', threads: 1 })
  for (const key of ['uRe', 'uIm', 'vRe', 'vIm', 'bRe', 'bIm'] as const) c.state[key].set(run.state[key])
  run.traces.forEach((t, k) => {
    c.traces[k].pumpOut.set(t.pumpOut.subarray(0, 2 * n))
    c.traces[k].stokesOut.set(t.stokesOut.subarray(0, 2 * n))
  })
  return c
}

/** Time index n of the driver's loop: interaction (variant), ports, then transport and the inputs of n + 1. */
function step(run: SimulationRun, n: number, variant: StepVariant, mean: MeanCoefficients | null): void {
  const m = run.model
  const s = run.state
  const nz = m.nz
  const c = m.exchangePerB
  const K = m.driveK, Er = m.svea.eRe, Ei = m.svea.eIm, h = m.dtS
  interactSveaVariant(s, 1, nz - 1, K, 0.5 * c, Er, Ei, h, variant, mean)
  interactSveaVariant(s, 0, 0, K, 0.25 * c, Er, Ei, h, variant, mean)
  interactSveaVariant(s, nz, nz, K, 0.25 * c, Er, Ei, h, variant, mean)
  const t = run.traces[0]
  t.pumpOut[2 * n] = m.sqrtKappaP * s.uRe[nz]
  t.pumpOut[2 * n + 1] = m.sqrtKappaP * s.uIm[nz]
  t.stokesOut[2 * n] = m.sqrtKappa * s.vRe[0]
  t.stokesOut[2 * n + 1] = m.sqrtKappa * s.vIm[0]
  if (n >= m.nt) return
  const loss = m.lossPerCell
  s.uRe.copyWithin(1, 0, nz)
  s.uIm.copyWithin(1, 0, nz)
  s.vRe.copyWithin(0, 1, nz + 1)
  s.vIm.copyWithin(0, 1, nz + 1)
  if (loss !== 1) {
    for (let j = 1; j <= nz; j++) (s.uRe[j] *= loss), (s.uIm[j] *= loss)
    for (let j = 0; j < nz; j++) (s.vRe[j] *= loss), (s.vIm[j] *= loss)
  }
  // The driver's flush of amplitudes below 1e-150 (steppers/subnormal-flush.ts): inputs every step, the state every flushEvery steps.
  s.uRe[0] = flushValue(t.pumpIn[2 * (n + 1)] / m.sqrtKappaP)
  s.uIm[0] = flushValue(t.pumpIn[2 * (n + 1) + 1] / m.sqrtKappaP)
  s.vRe[nz] = flushValue(t.stokesIn[2 * (n + 1)] / m.sqrtKappa)
  s.vIm[nz] = flushValue(t.stokesIn[2 * (n + 1) + 1] / m.sqrtKappa)
  if ((n + 1) % run.flushEvery === 0) flushTiny([s.uRe, s.uIm, s.vRe, s.vIm, s.bRe, s.bIm])
}
