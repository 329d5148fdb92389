// `npm run solve -- config.json --out dir/`: validate, estimate, run, then write manifest.json and one NPY per
// array. Ctrl-C aborts the run through an AbortController and leaves no output directory behind.
import { readFileSync } from 'node:fs'
import { z } from 'zod'
import { SimulationConfig } from '@shared/physics/simulation-config'
import { chooseGrid } from '@shared/physics/grid-step'
import { checkLimits, estimateResources } from '@shared/physics/resource-estimate'
import { deriveQuantities } from '@shared/physics/derived-quantities'
import { simulate } from '../index'
import { buildRunManifest } from '../io/manifest'
import { parseArgs, USAGE, UsageError } from './args'
import { progressSink } from './progress'
import { advisoryLines, estimateLines, figureLines } from './report'
import { checkOutputDir, OutputDirError, writeRunDir } from './write-run'

export const EXIT = { ok: 0, runFailed: 1, badInput: 2, interrupted: 130 } as const

const out = (s: string) => process.stdout.write(s + '\n')
const err = (s: string) => process.stderr.write(s + '\n')

export function configJsonSchema(): unknown {
  // Input view: fields with defaults are optional in a config file. Refinements (cross-field checks) are not
  // expressible in JSON Schema and are applied when the file is parsed.
  return z.toJSONSchema(SimulationConfig, { io: 'input', unrepresentable: 'any' })
}

function readConfig(path: string): SimulationConfig | null {
  let text: string
  try {
    text = readFileSync(path, 'utf8')
  } catch (e) {
    err(`Cannot read ${path}: ${(e as Error).message}`)
    return null
  }
  let json: unknown
  try {
    json = JSON.parse(text)
  } catch (e) {
    err(`${path} is not valid JSON: ${(e as Error).message}`)
    return null
  }
  const parsed = SimulationConfig.safeParse(json)
  if (!parsed.success) {
    err(`${path} is not a valid configuration:`)
    for (const i of parsed.error.issues) err(`  ${i.path.length ? i.path.join('.') : '(top level)'}: ${i.message}`)
    return null
  }
  return parsed.data
}

export async function main(argv: string[]): Promise<number> {
  let args
  try {
    args = parseArgs(argv)
  } catch (e) {
    if (!(e instanceof UsageError)) throw e
    err(e.message)
    err(USAGE)
    return EXIT.badInput
  }
  if (args.mode === 'help') return out(USAGE), EXIT.ok
  if (args.mode === 'schema') return out(JSON.stringify(configJsonSchema(), null, 2)), EXIT.ok

  const config = readConfig(args.configPath!)
  if (!config) return EXIT.badInput
  try {
    checkOutputDir(args.outDir!, args.force)
  } catch (e) {
    if (!(e instanceof OutputDirError)) throw e
    err(e.message)
    return EXIT.badInput
  }

  const grid = chooseGrid(config)
  const estimate = estimateResources(config, grid)
  estimateLines(estimate).forEach(out)
  const advisories = deriveQuantities({ waveguide: config.waveguide, config, grid }).warnings
  advisoryLines(advisories).forEach(out)
  const shownCodes = new Set(advisories.map((a) => a.code))
  const limits = checkLimits(estimate)
  if (!limits.ok) {
    err(`Refused: ${limits.message}`)
    return EXIT.badInput
  }

  const controller = new AbortController()
  let interrupts = 0
  const onSigint = () => {
    interrupts++
    if (interrupts > 1) process.exit(EXIT.interrupted)
    controller.abort()
  }
  process.on('SIGINT', onSigint)
  try {
    const startedAt = new Date()
    const progress = progressSink(process.stdout)
    const result = await simulate(config, { onProgress: (f) => progress.update(f), signal: controller.signal, engine: args.engine, threads: args.threads })
    progress.done()
    if (result.status === 'aborted' || controller.signal.aborted) {
      err(`Interrupted (${result.message}); nothing was written.`)
      return EXIT.interrupted
    }
    if (result.status === 'failed') {
      err(`The run failed: ${result.message}`)
      for (const i of result.manifest.issues) err(`  ${i.path}: ${i.message}`)
      return result.manifest.issues.length > 0 ? EXIT.badInput : EXIT.runFailed
    }
    const finishedAt = new Date()
    const manifest = buildRunManifest(result.manifest, config, estimate, {
      startedAt: startedAt.toISOString(),
      finishedAt: finishedAt.toISOString(),
      wallTimeS: (finishedAt.getTime() - startedAt.getTime()) / 1000,
    })
    if (!writeRunDir(args.outDir!, manifest, result.arrays, () => controller.signal.aborted)) {
      err('Interrupted while writing; nothing was written.')
      return EXIT.interrupted
    }
    // The pre-run cautions were printed above; only what the outputs revealed is new.
    for (const w of result.manifest.warnings) if (!shownCodes.has(w.code)) out(`warning: ${w.message}`)
    if (result.manifest.figures) figureLines(result.manifest.figures).forEach(out)
    out(`wrote ${manifest.arrays.length} arrays and manifest.json to ${args.outDir}`)
    return EXIT.ok
  } finally {
    process.off('SIGINT', onSigint)
  }
}

main(process.argv.slice(2)).then(
  (code) => {
    process.exitCode = code
  },
  (e) => {
    err(`Unexpected error: ${(e as Error).stack ?? e}`)
    process.exitCode = EXIT.runFailed
  },
)
