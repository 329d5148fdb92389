// Human-readable lines printed by the CLI before and after a run.
import type { ResourceEstimate } from '@shared/physics/resource-estimate'
import type { Advisory } from '@shared/physics/laser-safety'
import type { FiguresOfMerit } from '@shared/physics/simulation-result'

const sig = (x: number, p = 4) => x.toPrecision(p)
const mib = (b: number) => `${(b / 1024 ** 2).toFixed(1)} MiB`

export function estimateLines(e: ResourceEstimate): string[] {
  return [
    `grid: ${e.cells} cells × ${e.steps} steps, Δt = ${sig(e.timeStepPs)} ps, ${e.channels} channel(s)`,
    `work: ${sig(e.cellUpdates, 3)} cell-updates, memory ≈ ${mib(e.memoryBytes.total)} ` +
      `(state ${mib(e.memoryBytes.state)}, maps ${mib(e.memoryBytes.maps)}, traces ${mib(e.memoryBytes.traces)})`,
    `expected time ≈ ${sig(e.expectedSeconds, 2)} s at ${sig(e.cellUpdatesPerS / 1e6, 3)} M cell-updates/s ` +
      `(${sig(e.timeBasis.fastSeconds, 2)}–${sig(e.timeBasis.slowSeconds, 2)} s; from the benchmark figures: the command line keeps no history of its runs)`,
  ]
}

export function advisoryLines(advisories: Advisory[]): string[] {
  return advisories.filter((a) => a.severity !== 'info').map((a) => `${a.severity === 'danger' ? 'DANGER' : 'warning'}: ${a.message}`)
}

const joule = (j: number) => `${sig(j, 4)} J`

export function figureLines(f: FiguresOfMerit): string[] {
  const lines: string[] = []
  for (const ch of f.channels) {
    const e = ch.energyJ
    lines.push(`channel ${ch.channel + 1}: pump in ${joule(e.pumpIn)}, out ${joule(e.pumpOut)}; Stokes in ${joule(e.stokesIn)}, out ${joule(e.stokesOut)}`)
    const extra: string[] = []
    if (ch.peakStokesGainDb !== null) extra.push(`peak Stokes gain ${ch.peakStokesGainDb.toFixed(2)} dB`)
    if (ch.reflectivity !== null) extra.push(`reflectivity ${sig(ch.reflectivity, 3)}`)
    if (ch.retrievalEfficiency !== null) extra.push(`retrieval efficiency ${sig(ch.retrievalEfficiency, 4)}`)
    if (ch.leakThrough !== null) extra.push(`leak-through ${sig(ch.leakThrough, 3)}`)
    if (ch.retrievedPhaseRad !== null) extra.push(`retrieved phase ${ch.retrievedPhaseRad.toFixed(3)} rad`)
    for (const d of ch.notDetermined) if (d.figure === 'retrievalEfficiency' || d.figure.endsWith('Ns')) extra.push(`${d.figure} not determined: ${d.message}`)
    if (ch.manleyRoweResidual !== null) extra.push(`Manley–Rowe residual ${ch.manleyRoweResidual.toExponential(1)}`)
    if (extra.length) lines.push(`  ${extra.join(', ')}`)
  }
  for (const w of f.windows) lines.push(`window "${w.label}" (${w.port}, ${w.startNs}–${w.endNs} ns): ${w.energyJ === null ? `not determined: ${w.notDetermined?.message ?? ''}` : joule(w.energyJ)}`)
  lines.push(...errorEstimateLines(f))
  lines.push(`wall time ${f.wallTimeS.toFixed(2)} s, ${sig(f.cellUpdatesPerS / 1e6, 3)} M cell-updates/s`)
  return lines
}

/** "channels.0.energyJ.stokesOut" → "channel 1 energy stokes out"; windows by their label. */
function figureName(path: string, f: FiguresOfMerit): string {
  const words = (k: string) => k.replace(/(Ns|Db|Rad|J)$/, '').replace(/([a-z])([A-Z])/g, '$1 $2').toLowerCase()
  const [group, index, ...rest] = path.split('.')
  if (group === 'channels') return `channel ${Number(index) + 1} ${rest.map(words).join(' ')}`
  if (group === 'windows') return `window "${f.windows[Number(index)]?.label ?? index}"`
  return path.split('.').map(words).join(' ')
}

/** The largest estimated numerical error, and the flagged figures with the step that fixes them. */
function errorEstimateLines(f: FiguresOfMerit): string[] {
  const e = f.errorEstimate
  if (!e) return []
  if (e.status !== 'estimated') return [`error estimate: ${e.reason ?? e.status}`]
  const entries = Object.entries(e.figures).filter(([, x]) => x.relError !== null)
  if (entries.length === 0) return ['error estimate: no figure to estimate']
  const [path, worst] = entries.reduce((a, b) => (b[1].relError! > a[1].relError! ? b : a))
  const lines = [`error estimate (rerun at Δt = ${sig(e.coarseTimeStepPs!, 3)} ps): largest ${sig(100 * worst.relError!, 2)} % (${figureName(path, f)})`]
  for (const [p, x] of entries) if (x.flagged) lines.push(`  ${figureName(p, f)}: ${sig(100 * x.relError!, 2)} % > ${100 * e.flagAboveRelError} %; Δt ≤ ${x.suggestedTimeStepPs} ps for < ${100 * e.targetRelError} %`)
  return lines
}
