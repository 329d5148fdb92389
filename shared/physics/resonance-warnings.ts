// Cautions for Stokes cascades and forward resonances (figures from shared/physics/resonance-quantities.ts).
import type { SimulationConfig, ForwardInputs } from './simulation-config'
import type { Advisory } from './laser-safety'
import type { ResonanceQuantities } from './resonance-quantities'

const launches = (p: { pulses: unknown[]; backgroundPowerW: number } | undefined) => !!p && (p.pulses.length > 0 || p.backgroundPowerW > 0)
const sig = (x: number) => (x === 0 ? '0' : x.toPrecision(3))

export function resonanceAdvisories(q: ResonanceQuantities, cfg: SimulationConfig, pumpPowerW: number): Advisory[] {
  const out: Advisory[] = []
  const noiseOn = cfg.options.noise.enabled
  const cascade = cfg.options.cascade
  if (q.cascade && cascade.seedPowerW === 0 && !noiseOn) {
    // The coupled equations only amplify what is there: an order with zero field stays at zero.
    out.push({
      code: 'cascade-dark',
      severity: 'warning',
      message:
        cascade.stokesOrders === 2
          ? 'The 2nd Stokes order has no seed power and no thermal noise: it starts from nothing and stays dark. Set a seed power for the higher orders or switch on thermal noise.'
          : `Stokes orders 2 to ${cascade.stokesOrders} have no seed power and no thermal noise: they start from nothing and stay dark. Set a seed power for the higher orders or switch on thermal noise.`,
    })
  } else if (q.cascade && pumpPowerW < q.cascade.secondOrderPumpThresholdW) {
    out.push({
      code: 'cascade-below-threshold',
      severity: 'info',
      message: `The pump (${sig(pumpPowerW)} W) is below the estimated ${sig(q.cascade.secondOrderPumpThresholdW)} W at which the 2nd Stokes order reaches threshold: the higher orders stay near their seed level.`,
    })
  }
  const forward = cfg.waveguide.forwardResonances ?? []
  const inputs: ForwardInputs[] = cfg.channels[0]?.forwardInputs ?? []
  forward.forEach((f, i) => {
    const fig = q.resonances.find((r) => r.kind === 'forward' && r.index === i + 1)
    if (!noiseOn && !launches(inputs[i]?.stokes) && !launches(inputs[i]?.antiStokes)) {
      out.push({
        code: 'forward-dark',
        severity: 'warning',
        message: `Forward resonance ${i + 1} has nothing launched into its forward Stokes or anti-Stokes wave and no thermal noise: both stay dark. Launch a small forward Stokes input or switch on thermal noise.`,
      })
    }
    // Stokes and anti-Stokes share one acoustic field; while |Δk| is below the gain rate the anti-Stokes
    // process takes back what the Stokes process gives, and the forward Stokes grows less than
    // exp(G_F P L_eff) (Bloembergen & Shen, Phys. Rev. Lett. 12, 504, 1964, for Raman; cited from memory).
    const rate = fig ? fig.gainParameterPerWM * pumpPowerW : 0
    if (cfg.options.forwardAntiStokes && rate > 0 && Math.abs(f.antiStokesMismatchPerM) < rate) {
      out.push({
        code: 'forward-gain-suppression',
        severity: 'info',
        message: `Forward resonance ${i + 1}: the anti-Stokes mismatch |Δk| = ${sig(Math.abs(f.antiStokesMismatchPerM))} 1/m is below the gain rate G_F P = ${sig(rate)} 1/m, so Stokes and anti-Stokes draw on one acoustic field and the forward Stokes grows less than the small-signal estimate (least at Δk = 0).`,
      })
    }
  })
  return out
}
