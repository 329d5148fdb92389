// Figures of a multi-wave run (shared/physics/wave-figures.ts): energy in and out of every wave, the photon
// balance over all waves (Manley–Rowe: each process moves photons between its two waves one for one, so
// Σ_w (N_in − N_out − N_left) = 0 without loss, N = E/(ħω); Boyd, Nonlinear Optics) and the non-reciprocity
// of a probe at the Stokes frequency launched against and with the pump.
import type { NotDetermined } from '@shared/physics/simulation-result'
import type { WaveFigures } from '@shared/physics/wave-figures'
import { energyJ } from '../observers/trace-measures'
import type { NetworkModel } from './network-model'

export function waveFigures(m: NetworkModel, waveIn: Float64Array[], waveOut: Float64Array[], leftJ: number[]): WaveFigures {
  const dt = m.dtS
  const waves = m.set.waves.map((w, k) => {
    const energyInJ = energyJ(waveIn[k], dt)
    const energyOutJ = energyJ(waveOut[k], dt)
    const transmission = energyInJ > 0 ? energyOutJ / energyInJ : null
    const gainDb = transmission !== null && transmission > 0 ? 10 * Math.log10(transmission) : null
    return { key: w.key, label: w.label, direction: w.direction, offsetGHz: w.offsetGHz, energyInJ, energyOutJ, transmission, gainDb: transmission === null ? null : gainDb }
  })
  // Photon numbers in units of ħω_ref: E/(ω_w/ω_ref).
  let balance = 0
  let photonsIn = 0
  waves.forEach((w, k) => {
    const per = m.waves[k].powerPerFlux
    balance += (w.energyInJ - w.energyOutJ - leftJ[k]) / per
    photonsIn += w.energyInJ / per
  })
  const photonBalanceResidual = m.rates.alphaPerM === 0 && photonsIn > 0 ? Math.abs(balance) / photonsIn : null
  const counter = waves.find((w) => w.key === 'stokes')?.transmission ?? null
  const co = waves.find((w) => w.key === 'co_probe')?.transmission ?? null
  const nonReciprocity = counter !== null && co !== null && counter > 0 && co > 0 ? { counterTransmission: counter, coTransmission: co, isolationDb: 10 * Math.log10(counter / co) } : null
  return { waves, photonBalanceResidual, nonReciprocity }
}

/** Why the pump–Stokes pair's own Manley–Rowe residual is not given when other waves trade photons with the pair. */
export function pairResidualNote(m: NetworkModel): NotDetermined | null {
  const others = m.processes.some((p) => !(p.higher === 0 && p.lower === 1) && (p.higher <= 1 || p.lower <= 1))
  if (!others) return null
  return {
    figure: 'manleyRoweResidual',
    code: 'other-waves',
    message: 'Other waves exchange light with the pump or the Stokes wave, so the pair alone does not balance; the photon balance over all waves is given with the wave figures.',
  }
}
