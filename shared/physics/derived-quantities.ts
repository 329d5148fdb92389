// Quantities derived from a waveguide (and, when given, a run configuration) shown before a run.
// Formulas follow docs/model.md; sources are named beside each. Pure: no Node or DOM APIs.
import type { Waveguide } from './waveguide'
import { pulseFeatureNs, type SimulationConfig } from './simulation-config'
import type { Pulse } from './pulse'
import { BOLTZMANN_J_PER_K, REDUCED_PLANCK_J_S, SPEED_OF_LIGHT_M_PER_S } from './physical-constants'
import { DB_PER_NEPER_POWER, dbPerMToPerM } from './units'
import { chooseGrid } from './grid-step'
import { laserSafetyAdvisories, type Advisory } from './laser-safety'
import { MIN_CELLS_PER_PULSE, physicsAdvisories } from './derived-warnings'
import { resonanceQuantities, resonanceRows, type ResonanceQuantities } from './resonance-quantities'
import { resonanceAdvisories } from './resonance-warnings'
export { DEFAULT_DISPERSION_PS2_PER_KM, MIN_CELLS_PER_PULSE } from './derived-warnings'

export type { Advisory } from './laser-safety'

/** Photoelastic and density data that the waveguide schema does not carry; needed for g_B from material constants. */
export interface AcoustoOpticMaterial {
  photoelasticP12: number
  densityKgPerM3: number
}

/** The grid the solver would use (from shared/physics/grid-step.ts chooseGrid). */
export interface GridSummary {
  dtS: number
  dzM: number
  nz: number
  nt: number
}

export interface DerivedInput {
  waveguide: Waveguide
  config?: SimulationConfig
  /** Pump power for G₀, Kerr phase and threshold checks; defaults to the largest pump power in the config. */
  pumpPowerW?: number
  material?: AcoustoOpticMaterial
  /** The grid to report; by default the one chooseGrid picks for `config`. */
  grid?: GridSummary
  temperatureK?: number
}

export interface DerivedOptions {
  damageIntensityWPerCm2?: number
  /** |β₂| used for the dispersion-length check; default typical of standard single-mode fibre at 1550 nm. */
  dispersionPs2PerKm?: number
  /** Whether the guide is an optical fibre (fibre-fuse check); default: lengths of 1 m and more are fibre. */
  isFibre?: boolean
}

/** Smith 1972 threshold factor; a rule of thumb whose value depends on the threshold definition (Kobyakov et al. 2010). */
export const SMITH_THRESHOLD_FACTOR = 21

export interface DerivedRow {
  quantity: string
  value: number
  unit: string
  label: string
  note?: string
}

export interface DerivedQuantities {
  brillouinShiftFromIndexGHz?: number
  acousticVelocityMPerS: number
  acousticWavelengthNm: number
  gammaBRadPerS: number
  phononLifetimeEnergyNs: number
  phononLifetimeAmplitudeNs: number
  acousticDecayLengthUm: number
  gainFromMaterial?: { formIndexMPerW: number; formElectrostrictiveMPerW: number }
  gainParameterPerWM: number
  couplingKappa: number
  lossPerM: number
  effectiveLengthM: number
  pumpPowerW: number
  smallSignalGainNepers: number
  smallSignalGainDb: number
  netGainDb: number
  criticalPowerW: number
  transitTimeNs: number
  kerrGammaPerWM: number
  kerrPhaseRad: number
  temperatureK: number
  thermalOccupation: number
  /** Further and forward resonances, cascade thresholds and the co-propagating probe (resonance-quantities.ts). */
  resonanceFigures: ResonanceQuantities
  grid?: GridSummary & { shortestFeatureNs?: number; cellsAcrossShortestPulse?: number }
  rows: DerivedRow[]
  warnings: Advisory[]
}

/** ν_B = 2 n v_A / λ (Agrawal ch. 9). */
export function brillouinShiftHz(phaseIndex: number, acousticVelocityMPerS: number, wavelengthM: number): number {
  return (2 * phaseIndex * acousticVelocityMPerS) / wavelengthM
}

/**
 * Peak Brillouin gain from material constants, in both of its usual forms (Agrawal ch. 9):
 * g_B = 2π n⁷ p₁₂² / (c λ² ρ₀ v_A Δν_B) and g_B = γ_e² ω² / (n v_A c³ ρ₀ Γ_B) with γ_e = n⁴ p₁₂.
 */
export function brillouinGainFromMaterial(
  phaseIndex: number,
  m: AcoustoOpticMaterial,
  acousticVelocityMPerS: number,
  wavelengthM: number,
  linewidthHz: number,
): { formIndexMPerW: number; formElectrostrictiveMPerW: number } {
  const c = SPEED_OF_LIGHT_M_PER_S
  const n = phaseIndex
  const formIndexMPerW =
    (2 * Math.PI * n ** 7 * m.photoelasticP12 ** 2) /
    (c * wavelengthM ** 2 * m.densityKgPerM3 * acousticVelocityMPerS * linewidthHz)
  const gammaE = n ** 4 * m.photoelasticP12
  const omega = (2 * Math.PI * c) / wavelengthM
  const gammaB = 2 * Math.PI * linewidthHz
  const formElectrostrictiveMPerW =
    (gammaE ** 2 * omega ** 2) / (n * acousticVelocityMPerS * c ** 3 * m.densityKgPerM3 * gammaB)
  return { formIndexMPerW, formElectrostrictiveMPerW }
}

/** L_eff = (1 − e^{−αL})/α, → L as α → 0 (Agrawal ch. 9). */
export function effectiveLengthM(lossPerM: number, lengthM: number): number {
  const x = lossPerM * lengthM
  // −expm1(−x)/α keeps full precision for tiny losses.
  return x < 1e-12 ? lengthM : -Math.expm1(-x) / lossPerM
}

/** Threshold rule of thumb P_cr ≈ 21 A_eff/(g_B L_eff) (Smith 1972). */
export function criticalPowerW(effectiveAreaM2: number, gainCoefficientMPerW: number, effLengthM: number): number {
  return (SMITH_THRESHOLD_FACTOR * effectiveAreaM2) / (gainCoefficientMPerW * effLengthM)
}

/** Bose–Einstein occupation n_th = 1/(e^{ħΩ/k_BT} − 1). */
export function thermalOccupation(frequencyHz: number, temperatureK: number): number {
  return 1 / Math.expm1((REDUCED_PLANCK_J_S * 2 * Math.PI * frequencyHz) / (BOLTZMANN_J_PER_K * temperatureK))
}

const allPulses = (c: SimulationConfig): Pulse[] => c.channels.flatMap((ch) => [...ch.pump.pulses, ...ch.stokes.pulses])
const portPeakW = (p: { pulses: Pulse[]; backgroundPowerW: number }): number =>
  Math.max(0, ...p.pulses.map((x) => x.peakPowerW)) + p.backgroundPowerW

/** Continuous power at a port: the leak between pulses plus pulses that fill at least half the window. */
function portCwW(p: { pulses: Pulse[]; backgroundPowerW: number }, windowNs: number): number {
  const longPulses = p.pulses.filter((x) => 'fwhmNs' in x && x.fwhmNs >= windowNs / 2).map((x) => x.peakPowerW)
  return Math.max(0, ...longPulses) + p.backgroundPowerW
}

export function deriveQuantities(input: DerivedInput, options: DerivedOptions = {}): DerivedQuantities {
  const w = input.waveguide
  const cfg = input.config
  const c = SPEED_OF_LIGHT_M_PER_S
  const lambdaM = w.wavelengthNm * 1e-9
  const n = w.phaseIndex
  const nuBHz = w.brillouinShiftGHz * 1e9
  const linewidthHz = w.linewidthMHz * 1e6
  const areaM2 = w.effectiveAreaUm2 * 1e-12

  const shiftFromIndexHz = w.acousticVelocityMPerS !== undefined ? brillouinShiftHz(n, w.acousticVelocityMPerS, lambdaM) : undefined
  // Without a given sound speed, invert the Bragg condition from the stated shift.
  const vA = w.acousticVelocityMPerS ?? (nuBHz * lambdaM) / (2 * n)
  const gammaB = 2 * Math.PI * linewidthHz
  const gainParameter = (w.polarisationFactor * w.gainCoefficientMPerW) / areaM2
  const alpha = dbPerMToPerM(w.lossDbPerM)
  const lEff = effectiveLengthM(alpha, w.lengthM)
  const pumpPowerW = input.pumpPowerW ?? (cfg ? Math.max(0, ...cfg.channels.map((ch) => portPeakW(ch.pump))) : 0)
  const g0 = gainParameter * pumpPowerW * lEff
  const temperatureK = input.temperatureK ?? cfg?.options.noise.temperatureK ?? 295
  const kerrGamma = (2 * Math.PI * w.kerrN2M2PerW) / (lambdaM * areaM2)

  const d: DerivedQuantities = {
    brillouinShiftFromIndexGHz: shiftFromIndexHz !== undefined ? shiftFromIndexHz / 1e9 : undefined,
    acousticVelocityMPerS: vA,
    acousticWavelengthNm: (lambdaM / (2 * n)) * 1e9,
    gammaBRadPerS: gammaB,
    phononLifetimeEnergyNs: 1e9 / gammaB,
    phononLifetimeAmplitudeNs: 2e9 / gammaB,
    acousticDecayLengthUm: (vA / gammaB) * 1e6,
    gainFromMaterial: input.material ? brillouinGainFromMaterial(n, input.material, vA, lambdaM, linewidthHz) : undefined,
    gainParameterPerWM: gainParameter,
    couplingKappa: 0.5 * Math.sqrt(gainParameter * gammaB),
    lossPerM: alpha,
    effectiveLengthM: lEff,
    pumpPowerW,
    smallSignalGainNepers: g0,
    smallSignalGainDb: DB_PER_NEPER_POWER * g0,
    netGainDb: DB_PER_NEPER_POWER * (g0 - alpha * w.lengthM),
    criticalPowerW: criticalPowerW(areaM2, w.gainCoefficientMPerW, lEff),
    transitTimeNs: ((w.groupIndex * w.lengthM) / c) * 1e9,
    kerrGammaPerWM: kerrGamma,
    kerrPhaseRad: kerrGamma * pumpPowerW * lEff,
    temperatureK,
    thermalOccupation: thermalOccupation(nuBHz, temperatureK),
    resonanceFigures: resonanceQuantities({ waveguide: w, config: cfg, pumpPowerW, effectiveLengthM: lEff, lossPerM: alpha, mainGainNepers: g0 }),
    rows: [],
    warnings: [],
  }

  const grid = input.grid ?? (cfg ? chooseGrid(cfg) : undefined)
  if (grid) {
    const features = cfg ? allPulses(cfg).map(pulseFeatureNs) : []
    const shortestFeatureNs = features.length ? Math.min(...features) : undefined
    d.grid = {
      dtS: grid.dtS,
      dzM: grid.dzM,
      nz: grid.nz,
      nt: grid.nt,
      shortestFeatureNs,
      cellsAcrossShortestPulse: shortestFeatureNs !== undefined ? (shortestFeatureNs * 1e-9) / grid.dtS : undefined,
    }
  }

  d.rows = derivedRows(d, w)
  d.warnings = physicsAdvisories(d, w, cfg, options)
  if (cfg) {
    d.warnings.push(...resonanceAdvisories(d.resonanceFigures, cfg, pumpPowerW))
    const stokesInW = Math.max(0, ...cfg.channels.map((ch) => portPeakW(ch.stokes)))
    // Every other input is light in the guide too: the co-propagating probe, forward inputs, cascade seeds.
    const otherInputs = cfg.channels.flatMap((ch) => [...(ch.coProbe ? [ch.coProbe] : []), ...ch.forwardInputs.flatMap((f) => [f.stokes, f.antiStokes])])
    const seedW = cfg.options.cascade.stokesOrders > 1 ? cfg.options.cascade.seedPowerW : 0
    d.warnings.push(
      ...laserSafetyAdvisories({
        maxCwPowerW: Math.max(
          seedW,
          ...cfg.channels.flatMap((ch) => [portCwW(ch.pump, cfg.windowNs), portCwW(ch.stokes, cfg.windowNs)]),
          ...otherInputs.map((p) => portCwW(p, cfg.windowNs)),
        ),
        maxPeakPowerW: Math.max(pumpPowerW, stokesInW, seedW, ...otherInputs.map(portPeakW)),
        effectiveAreaUm2: w.effectiveAreaUm2,
        isFibre: options.isFibre ?? w.lengthM >= 1,
        // Undepleted estimate; depletion caps the true value, so this errs towards warning.
        stokesToPumpRatio: pumpPowerW > 0 ? (stokesInW * Math.exp(g0 - alpha * w.lengthM)) / pumpPowerW : undefined,
        damageIntensityWPerCm2: options.damageIntensityWPerCm2,
      }),
    )
  }
  return d
}

function derivedRows(d: DerivedQuantities, w: Waveguide): DerivedRow[] {
  const rows: DerivedRow[] = []
  const add = (quantity: string, value: number | undefined, unit: string, label: string, note?: string) => {
    if (value !== undefined && Number.isFinite(value)) rows.push({ quantity, value, unit, label, note })
  }
  add('brillouinShiftFromIndexGHz', d.brillouinShiftFromIndexGHz, 'GHz', 'Brillouin shift from index and sound speed', 'ν_B = 2 n v_A/λ (Agrawal ch. 9)')
  add('acousticVelocityMPerS', d.acousticVelocityMPerS, 'm/s', 'Sound speed', w.acousticVelocityMPerS === undefined ? 'From the stated shift: v_A = ν_B λ/(2n)' : 'As entered')
  add('acousticWavelengthNm', d.acousticWavelengthNm, 'nm', 'Acoustic wavelength', 'Λ = λ/(2n) (Bragg condition, backward SBS)')
  add('gammaBRadPerS', d.gammaBRadPerS, 'rad/s', 'Phonon energy decay rate Γ_B', 'Γ_B = 2π Δν_B')
  add('phononLifetimeEnergyNs', d.phononLifetimeEnergyNs, 'ns', 'Phonon lifetime (energy, phonon number)', '1/Γ_B')
  add('phononLifetimeAmplitudeNs', d.phononLifetimeAmplitudeNs, 'ns', 'Phonon lifetime (amplitude)', '2/Γ_B')
  add('acousticDecayLengthUm', d.acousticDecayLengthUm, 'µm', 'Acoustic decay length', 'v_A/Γ_B')
  add('gainFromMaterialMPerW', d.gainFromMaterial?.formIndexMPerW, 'm/W', 'g_B from material constants', '2π n⁷ p₁₂²/(c λ² ρ₀ v_A Δν_B) (Agrawal ch. 9)')
  add('gainParameterPerWM', d.gainParameterPerWM, '1/(W m)', 'Gain parameter G_B', 'η_pol g_B/A_eff')
  add('couplingKappa', d.couplingKappa, '1/√(W s m)', 'Coupling constant κ', 'κ = ½√(G_B Γ_B)')
  add('effectiveLengthM', d.effectiveLengthM, 'm', 'Effective length L_eff', '(1 − e^{−αL})/α')
  add('smallSignalGainNepers', d.smallSignalGainNepers, '–', 'Small-signal gain exponent G₀', `G_B P₀ L_eff at P₀ = ${d.pumpPowerW.toPrecision(3)} W, line centre`)
  add('smallSignalGainDb', d.smallSignalGainDb, 'dB', 'Small-signal Brillouin gain', '4.343 G₀')
  add('netGainDb', d.netGainDb, 'dB', 'Net small-signal gain', '4.343 (G₀ − αL)')
  add('criticalPowerW', d.criticalPowerW, 'W', 'Critical (threshold) power', 'Rule of thumb (Smith 1972): P_cr ≈ 21 A_eff/(g_B L_eff); the factor depends on the threshold definition')
  add('transitTimeNs', d.transitTimeNs, 'ns', 'Transit time', 'n_g L/c')
  add('kerrGammaPerWM', d.kerrGammaPerWM, '1/(W m)', 'Kerr parameter γ', 'γ = n₂ω/(c A_eff)')
  add('kerrPhaseRad', d.kerrPhaseRad, 'rad', 'Kerr phase', 'γ P₀ L_eff')
  add('thermalOccupation', d.thermalOccupation, '–', 'Thermal phonon occupation n_th', `At ${d.temperatureK} K`)
  for (const r of resonanceRows(d.resonanceFigures, d.pumpPowerW)) add(r.quantity, r.value, r.unit, r.label, r.note)
  if (d.grid) {
    add('timeStepPs', d.grid.dtS * 1e12, 'ps', 'Time step Δt')
    add('spaceStepUm', d.grid.dzM * 1e6, 'µm', 'Space step Δz', 'Δz = v_g Δt')
    add('cells', d.grid.nz, '–', 'Cells along z')
    add('steps', d.grid.nt, '–', 'Time steps')
    add('cellsAcrossShortestPulse', d.grid.cellsAcrossShortestPulse, '–', 'Steps across the shortest pulse feature', `Keep ≥ ${MIN_CELLS_PER_PULSE}`)
  }
  return rows
}
