// Coverage of the oscillation analysis's uncertainties on synthetic traces with known truth
// (tests/traces/oscillation-synthetic.ts: a Gaussian pulse with a damped ripple and white or band-limited
// noise; fixed seeds). For each method and quantity: the share of cases whose truth lies inside the
// reported ±2σ (a figure not given counts as a miss), the share where spectrum and fit agree within
// 2√(σ_s² + σ_f²), and the median relative error. Prints figures and never asserts; the table in
// benchmarks/README.md was measured with it. `node --import tsx benchmarks/oscillation-coverage.ts [--quick]`
// or as part of `npm run bench`.
import { analyseOscillation } from '@shared/analysis/oscillation'
import { evaluateCase, gridCases, type CaseOutcome } from '../tests/traces/oscillation-synthetic'

const pct = (xs: boolean[]) => `${((100 * xs.filter(Boolean).length) / Math.max(1, xs.length)).toFixed(0)} %`
function median(xs: (number | null)[]): string {
  const v = xs.filter((x): x is number => x !== null).sort((a, b) => a - b)
  return v.length ? v[Math.floor(v.length / 2)].toExponential(1) : '–'
}
const pad = (s: string | number, n: number) => String(s).padStart(n)

function row(label: string, o: CaseOutcome[]): string {
  return [
    pad(label, 20),
    pad(o.length, 5),
    pad(pct(o.map((x) => x.covered.spectrumF)), 7),
    pad(pct(o.map((x) => x.covered.fitF)), 7),
    pad(pct(o.map((x) => x.covered.spectrumTau)), 7),
    pad(pct(o.map((x) => x.covered.fitTau)), 7),
    pad(pct(o.map((x) => x.agree.f)), 7),
    pad(pct(o.map((x) => x.agree.tau)), 7),
    pad(median(o.map((x) => x.relErr.spectrumF)), 8),
    pad(median(o.map((x) => x.relErr.fitF)), 8),
    pad(median(o.map((x) => x.relErr.spectrumTau)), 8),
    pad(median(o.map((x) => x.relErr.fitTau)), 8),
  ].join(' ')
}

export function oscillationCoverage(quick = false): CaseOutcome[] {
  const cases = gridCases().filter((c) => !quick || c.noise === 'white')
  console.log(`\n## Oscillation analysis: coverage of ±2σ on ${cases.length} synthetic traces with known truth`)
  const t0 = performance.now()
  const out = cases.map((c) => evaluateCase(c, (t, y) => analyseOscillation(t, y)))
  console.log(`(${((performance.now() - t0) / 1000).toFixed(1)} s, ${((performance.now() - t0) / cases.length).toFixed(0)} ms per trace)`)
  console.log(`${pad('cases', 20)} ${pad('n', 5)} ${pad('f spec', 7)} ${pad('f fit', 7)} ${pad('τ spec', 7)} ${pad('τ fit', 7)} ${pad('agree f', 7)} ${pad('agree τ', 7)} ${pad('|δf| sp', 8)} ${pad('|δf| fit', 8)} ${pad('|δτ| sp', 8)} ${pad('|δτ| fit', 8)}`)
  console.log(row('all', out))
  const groups: [string, (c: CaseOutcome['c']) => string | number][] = [
    ['f GHz', (c) => c.frequencyGHz],
    ['τ ns', (c) => c.decayNs],
    ['SNR', (c) => c.snr],
    ['envelope FWHM ns', (c) => c.envelopeFwhmNs],
    ['noise', (c) => c.noise],
  ]
  for (const [name, key] of groups) {
    for (const v of [...new Set(out.map((o) => key(o.c)))]) console.log(row(`${name} = ${v}`, out.filter((o) => key(o.c) === v)))
  }
  return out
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const out = oscillationCoverage(process.argv.includes('--quick'))
  if (process.argv.includes('--misses')) {
    for (const o of out) if (!Object.values(o.covered).every(Boolean) || !o.agree.f || !o.agree.tau) console.log(JSON.stringify({ c: o.c, covered: o.covered, agree: o.agree, relErr: o.relErr }))
  }
}
