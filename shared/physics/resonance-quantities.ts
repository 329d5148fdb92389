/*
 * Derived quantities of the further backward and the forward resonances, of a Stokes cascade and of a
 * co-propagating probe, shown in the form beside the main resonance's (shared/physics/derived-quantities.ts).
 *
 *   gain parameter        G_r = η_pol g_r / A_eff                                  (Agrawal, Nonlinear Fiber Optics, ch. 9)
 *   coupling constant     κ_r = ½ √(G_r Γ_r),  Γ_r = 2π Δν_r                       (docs/model.md, same form as the main resonance)
 *   small-signal gain     G_r P L_eff at line centre, undepleted pump              (Agrawal ch. 9)
 *   first-order threshold G P_th,1 L_eff ≈ 21                                      (Smith 1972, Appl. Opt. 11, 2489)
 *   second-order threshold the same criterion with the 1st Stokes as pump: P_S1 ≈ P_th,1 (same resonance, same L_eff);
 *                         above threshold the transmitted pump stays near P_th,1 and the rest turns into 1st Stokes,
 *                         photon for photon, so the pump needed is P_th,1 + (ν_p/ν_S1) P_th,1 (an order-of-magnitude
 *                         estimate, as Smith's criterion is; the clamping of the transmitted pump: Agrawal ch. 9)
 *   co-propagating probe  no backward gain: transmission e^{−αL}; isolation against the counter-propagating probe
 *                         10 log10(e^{G₀}) = 4.343 G₀ dB in the undepleted limit (Agrawal ch. 9)
 * The gain at a detuning from line centre (the Lorentzian sum) is the gain-spectrum module's job, not this one's.
 */
import type { Waveguide } from './waveguide'
import type { SimulationConfig } from './simulation-config'
import { DB_PER_NEPER_POWER } from './units'
import { SPEED_OF_LIGHT_M_PER_S } from './physical-constants'

/** Smith 1972's factor (as SMITH_THRESHOLD_FACTOR in derived-quantities.ts, which imports this file); its value depends on the threshold definition (Kobyakov et al. 2010). */
const SMITH_FACTOR = 21

export interface ResonanceFigures {
  kind: 'backward' | 'forward'
  /** 1-based position in its list (the main backward resonance is not repeated here). */
  index: number
  label: string
  frequencyGHz: number
  gainParameterPerWM: number
  couplingKappa: number
  smallSignalGainNepers: number
}

export interface CascadeFigures {
  orders: number
  firstOrderThresholdW: number
  /** 1st-Stokes power at which the 2nd order reaches the same criterion (W). */
  secondOrderStokesThresholdW: number
  /** Pump power at which the 2nd order reaches threshold (W). */
  secondOrderPumpThresholdW: number
}

export interface ResonanceQuantities {
  resonances: ResonanceFigures[]
  cascade: CascadeFigures | null
  /** Present when the run launches a co-propagating probe. */
  coProbe: { transmissionDb: number; isolationDb: number } | null
}

interface Context {
  waveguide: Waveguide
  config?: SimulationConfig
  pumpPowerW: number
  effectiveLengthM: number
  lossPerM: number
  /** G₀ of the main resonance at the same pump. */
  mainGainNepers: number
}

function figures(kind: 'backward' | 'forward', index: number, label: string | undefined, frequencyGHz: number, r: { linewidthMHz: number; gainCoefficientMPerW: number }, c: Context): ResonanceFigures {
  const w = c.waveguide
  const g = (w.polarisationFactor * r.gainCoefficientMPerW) / (w.effectiveAreaUm2 * 1e-12)
  const gamma = 2 * Math.PI * r.linewidthMHz * 1e6
  const name = kind === 'backward' ? `Further backward resonance ${index}` : `Forward resonance ${index}`
  return {
    kind,
    index,
    label: label ? `${name} (${label})` : name,
    frequencyGHz,
    gainParameterPerWM: g,
    couplingKappa: 0.5 * Math.sqrt(g * gamma),
    smallSignalGainNepers: g * c.pumpPowerW * c.effectiveLengthM,
  }
}

export function resonanceQuantities(c: Context): ResonanceQuantities {
  const w = c.waveguide
  const resonances = [
    ...(w.additionalResonances ?? []).map((r, i) => figures('backward', i + 1, r.label, r.shiftGHz, r, c)),
    ...(w.forwardResonances ?? []).map((r, i) => figures('forward', i + 1, r.label, r.frequencyMHz / 1000, r, c)),
  ]
  const orders = c.config?.options.cascade.stokesOrders ?? 1
  let cascade: CascadeFigures | null = null
  if (orders > 1) {
    const g = (w.polarisationFactor * w.gainCoefficientMPerW) / (w.effectiveAreaUm2 * 1e-12)
    const first = SMITH_FACTOR / (g * c.effectiveLengthM)
    const nuPumpHz = SPEED_OF_LIGHT_M_PER_S / (w.wavelengthNm * 1e-9)
    const nuStokesHz = nuPumpHz - w.brillouinShiftGHz * 1e9
    cascade = { orders, firstOrderThresholdW: first, secondOrderStokesThresholdW: first, secondOrderPumpThresholdW: first + (nuPumpHz / nuStokesHz) * first }
  }
  const coProbe = c.config?.channels[0]?.coProbe
    ? { transmissionDb: -DB_PER_NEPER_POWER * c.lossPerM * w.lengthM, isolationDb: DB_PER_NEPER_POWER * c.mainGainNepers }
    : null
  return { resonances, cascade, coProbe }
}

export interface ResonanceRow {
  quantity: string
  value: number
  unit: string
  label: string
  note?: string
}

/** Rows for the derived-quantities table, in the order a reader meets the form's sections. */
export function resonanceRows(q: ResonanceQuantities, pumpPowerW: number): ResonanceRow[] {
  const rows: ResonanceRow[] = []
  const p = pumpPowerW.toPrecision(3)
  for (const r of q.resonances) {
    const key = `${r.kind}Resonance${r.index}`
    const sym = r.kind === 'backward' ? `G_B,${r.index}` : `G_F,${r.index}`
    rows.push({ quantity: `${key}GainParameter`, value: r.gainParameterPerWM, unit: '1/(W m)', label: `${r.label}: gain parameter ${sym}`, note: 'η_pol g/A_eff' })
    rows.push({ quantity: `${key}Kappa`, value: r.couplingKappa, unit: '1/√(W s m)', label: `${r.label}: coupling constant κ`, note: 'κ = ½√(G Γ), Γ = 2π Δν' })
    rows.push({
      quantity: `${key}SmallSignalGain`,
      value: r.smallSignalGainNepers,
      unit: '–',
      label: `${r.label}: small-signal gain exponent`,
      note: r.kind === 'backward' ? `${sym} P₀ L_eff at P₀ = ${p} W, at its own line centre` : `${sym} P₀ L_eff at P₀ = ${p} W, forward Stokes alone, phase matched`,
    })
  }
  if (q.cascade) {
    rows.push({ quantity: 'cascadeFirstThresholdW', value: q.cascade.firstOrderThresholdW, unit: 'W', label: 'Threshold of the 1st Stokes order', note: 'G_B P_th L_eff ≈ 21 (Smith 1972), G_B = η_pol g_B/A_eff' })
    rows.push({ quantity: 'cascadeSecondThresholdW', value: q.cascade.secondOrderPumpThresholdW, unit: 'W', label: 'Pump power for the 2nd Stokes order', note: 'Same criterion with the 1st Stokes as pump: P_S1 ≈ P_th; the transmitted pump stays near P_th (order of magnitude)' })
  }
  if (q.coProbe) {
    rows.push({ quantity: 'coProbeTransmissionDb', value: q.coProbe.transmissionDb, unit: 'dB', label: 'Co-propagating probe transmission', note: 'No backward gain: loss only, −4.343 αL' })
    rows.push({ quantity: 'isolationEstimateDb', value: q.coProbe.isolationDb, unit: 'dB', label: 'Isolation between directions (estimate)', note: '4.343 G₀: counter- over co-propagating probe, undepleted, line centre' })
  }
  return rows
}
