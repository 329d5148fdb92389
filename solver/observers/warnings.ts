// Run warnings of the physics brief §5. Cautions only: the run still goes ahead.
import { maxPortPowerW, shortestFeatureNs } from '@shared/grid-step'
import type { SimulationConfig } from '@shared/simulation-config'
import type { FiguresOfMerit, SolverWarning } from '@shared/simulation-result'
import { um2ToM2 } from '@shared/units'
import type { Model } from '../problem/coupled-modes'

/** Thresholds of the brief §5 (values there; the damage figure is a configurable-guideline default). */
export const WARNING_LIMITS = {
  noiseFreeMaxG0: 15,
  sveaMinAcousticPeriods: 5,
  minSpacingLinewidths: 10,
  maxStokesToPump: 0.1,
  classicalNoiseMinK: 20,
  damageIntensityWPerM2: 1e13, // 1 GW/cm²
  fibreFuseCwW: 1,
  class4CwW: 0.5,
  minStepsPerPulse: 10,
  steadyStateDecayTimes: 20,
} as const

export function preRunWarnings(config: SimulationConfig, m: Model): SolverWarning[] {
  const out: SolverWarning[] = []
  const wg = config.waveguide
  const a = m.rates.alphaPerM
  const lEff = a > 0 ? -Math.expm1(-a * wg.lengthM) / a : wg.lengthM
  const pumpPeak = Math.max(...config.channels.map((c) => Math.max(c.pump.backgroundPowerW, ...c.pump.pulses.map((p) => p.peakPowerW))))
  const g0 = m.rates.gainPerWM * pumpPeak * lEff
  if (g0 > WARNING_LIMITS.noiseFreeMaxG0 && !config.options.noise.enabled)
    out.push({ code: 'high-gain-without-noise', message: `G₀ = ${g0.toFixed(1)} > 15 with thermal noise off: in practice spontaneous Stokes from noise would grow; turn noise on` })
  const tMinNs = shortestFeatureNs(config)
  if (!config.options.higherOrderAcoustic && tMinNs < WARNING_LIMITS.sveaMinAcousticPeriods / wg.brillouinShiftGHz)
    out.push({ code: 'pulse-short-for-svea', message: `The shortest pulse (${tMinNs} ns) is under 5 acoustic periods; consider the higher-order acoustic option` })
  if (Number.isFinite(tMinNs) && (tMinNs * 1e-9) / m.dtS < WARNING_LIMITS.minStepsPerPulse)
    out.push({ code: 'coarse-grid', message: `The shortest pulse spans only ${((tMinNs * 1e-9) / m.dtS).toFixed(1)} time steps (under 10)` })
  for (let i = 0; i < config.channels.length; i++)
    for (let j = i + 1; j < config.channels.length; j++)
      if (Math.abs(config.channels[i].offsetGHz - config.channels[j].offsetGHz) * 1e3 < WARNING_LIMITS.minSpacingLinewidths * wg.linewidthMHz)
        out.push({ code: 'channel-spacing', message: `Channels ${i + 1} and ${j + 1} are closer than 10 linewidths: dropped cross beats matter` })
  if (config.options.noise.enabled && config.options.noise.temperatureK < WARNING_LIMITS.classicalNoiseMinK)
    out.push({ code: 'low-temperature-noise', message: 'Below about 20 K the classical noise model is approximate (spontaneous scattering needs n_th + 1)' })
  const pMax = maxPortPowerW(config)
  if (pMax / um2ToM2(wg.effectiveAreaUm2) > WARNING_LIMITS.damageIntensityWPerM2)
    out.push({ code: 'damage-intensity', message: 'Peak intensity exceeds the 1 GW/cm² damage guideline' })
  const cw = Math.max(...config.channels.flatMap((c) => [c.pump.backgroundPowerW, c.stokes.backgroundPowerW]))
  if (cw >= WARNING_LIMITS.fibreFuseCwW)
    out.push({ code: 'fibre-fuse', message: 'CW power ≥ 1 W: in fibre, risk of a fibre fuse (Kashyap & Blow 1988)' })
  if (cw > WARNING_LIMITS.class4CwW)
    out.push({
      code: 'laser-safety',
      message: 'CW power above 500 mW is Class 4 territory under IEC 60825-1 (a hint, not a safety assessment): follow local rules and your laser safety officer',
    })
  if (pMax >= 1) out.push({ code: 'not-modelled', message: 'At these powers SRS, modulation instability, TPA/FCA and thermal effects may matter; they are not modelled' })
  if (!Number.isFinite(tMinNs) && config.windowNs * 1e-9 < WARNING_LIMITS.steadyStateDecayTimes / m.rates.gammaBPerS)
    out.push({ code: 'short-cw-run', message: `A CW steady state needs ≥ 20/Γ_B = ${((20 / m.rates.gammaBPerS) * 1e9).toFixed(0)} ns of window` })
  return out
}

export function postRunWarnings(f: FiguresOfMerit): SolverWarning[] {
  const out: SolverWarning[] = []
  for (const c of f.channels)
    if (c.energyJ.pumpIn > 0 && c.energyJ.stokesOut > WARNING_LIMITS.maxStokesToPump * c.energyJ.pumpIn)
      out.push({ code: 'strong-reflection', message: `Channel ${c.channel + 1}: Stokes output exceeds 10 % of the pump; back-reflected light can damage sources (use isolators)` })
  return out
}
