// Synthetic traces with known truth for the oscillation analysis: a Gaussian pulse with a damped ripple on it,
//   y(t) = P exp(−4 ln2 (t − t_p)²/w²) + A e^{−t/τ} sin(2πft + φ) + c + noise,   0 ≤ t ≤ T,
// P = 10 A (the pulse dominates the trace, as on a measured pulse with ringing), c = 0.2 A, A = 1,
// noise of standard deviation A/SNR, white or band-limited (first-order autoregressive, coefficient 0.7,
// scaled to the same standard deviation: what a receiver of limited bandwidth adds). Step 10 ps.
// T = max(5τ, 8/f, 6w + 2) ns up to 50 ns: the ripple decays, at least 8 cycles and the whole pulse fit in;
// the pulse sits at t_p = max(3w, T/5).
import { gaussianNoise } from './random'

export interface RippleCase {
  frequencyGHz: number
  decayNs: number
  snr: number
  envelopeFwhmNs: number
  noise: 'white' | 'band-limited'
  seed: number
}

export const STEP_NS = 0.01
export const PULSE_OVER_RIPPLE = 10
const AR_COEFFICIENT = 0.7

export function syntheticRipple(c: RippleCase) {
  const noise = gaussianNoise(c.seed)
  const T = Math.min(50, Math.max(5 * c.decayNs, 8 / c.frequencyGHz, 6 * c.envelopeFwhmNs + 2))
  const tp = Math.max(3 * c.envelopeFwhmNs, T / 5)
  const phi = 2 * Math.PI * ((c.seed * 0.618034) % 1)
  const n = Math.round(T / STEP_NS) + 1
  const timeNs = new Float64Array(n)
  const values = new Float64Array(n)
  const sigma = 1 / c.snr
  const ar = c.noise === 'white' ? 0 : AR_COEFFICIENT
  let colored = noise() * sigma
  for (let i = 0; i < n; i++) {
    const t = i * STEP_NS
    timeNs[i] = t
    colored = ar * colored + Math.sqrt(1 - ar * ar) * sigma * noise()
    values[i] = PULSE_OVER_RIPPLE * Math.exp((-4 * Math.LN2 * (t - tp) ** 2) / c.envelopeFwhmNs ** 2) + Math.exp(-t / c.decayNs) * Math.sin(2 * Math.PI * c.frequencyGHz * t + phi) + 0.2 + colored
  }
  return { timeNs, values, truth: { frequencyGHz: c.frequencyGHz, decayNs: c.decayNs, amplitude: 1 } }
}

/** Grid of the coverage check: frequency 0.5–10 GHz, decay 0.5–10 ns, SNR 10–1000, envelope FWHM 0.1–2 ns. */
export const GRID = {
  frequencyGHz: [0.5, 1.6, 4, 10],
  decayNs: [0.5, 1.5, 4, 10],
  snr: [10, 100, 1000],
  envelopeFwhmNs: [0.1, 0.5, 2],
  noise: ['white', 'band-limited'] as const,
}

export function gridCases(): RippleCase[] {
  const out: RippleCase[] = []
  for (const noise of GRID.noise)
    for (const frequencyGHz of GRID.frequencyGHz)
      for (const decayNs of GRID.decayNs)
        for (const snr of GRID.snr)
          for (const envelopeFwhmNs of GRID.envelopeFwhmNs) out.push({ frequencyGHz, decayNs, snr, envelopeFwhmNs, noise, seed: out.length + 1 })
  return out
}

/** Truth inside value ± 2σ; false when the value or σ is not given. */
const within2Sigma = (truth: number, v: number | null | undefined, s: number | null | undefined) => v != null && s != null && Math.abs(v - truth) <= 2 * s
const relErr = (truth: number, v: number | null | undefined) => (v == null ? null : Math.abs(v / truth - 1))

export interface CaseOutcome {
  c: RippleCase
  covered: { spectrumF: boolean; spectrumTau: boolean; fitF: boolean; fitTau: boolean }
  agree: { f: boolean; tau: boolean }
  relErr: { spectrumF: number | null; spectrumTau: number | null; fitF: number | null; fitTau: number | null }
}

export function evaluateCase(c: RippleCase, analyse: (t: Float64Array, y: Float64Array) => import('@shared/analysis/oscillation').OscillationResult): CaseOutcome {
  const s = syntheticRipple(c)
  const r = analyse(s.timeNs, s.values)
  const { frequencyGHz: f, decayNs: tau } = s.truth
  const sp = r.spectral
  const fit = r.fit
  return {
    c,
    covered: {
      spectrumF: within2Sigma(f, sp?.frequencyGHz, sp?.frequencyUncertaintyGHz),
      spectrumTau: within2Sigma(tau, sp?.decayNs, sp?.decayUncertaintyNs),
      fitF: within2Sigma(f, fit?.frequencyGHz, fit?.frequencyUncertaintyGHz),
      fitTau: within2Sigma(tau, fit?.decayNs, fit?.decayUncertaintyNs),
    },
    agree: { f: r.agreement?.frequency === true, tau: r.agreement?.decay === true },
    relErr: { spectrumF: relErr(f, sp?.frequencyGHz), spectrumTau: relErr(tau, sp?.decayNs), fitF: relErr(f, fit?.frequencyGHz), fitTau: relErr(tau, fit?.decayNs) },
  }
}
