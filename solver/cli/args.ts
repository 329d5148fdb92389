// Command line of `npm run solve -- config.json --out dir/ [--force]` and `npm run solve -- --schema`, read
// with node:util parseArgs. Its tokens are checked here rather than in its strict mode, so every mistake gets
// a message in our words (which option, what it needs) instead of Node's.
import { parseArgs as parseArgv } from 'node:util'
import { ENGINE_CHOICES, type EngineChoice } from '../engine/wasm-engine'
import { MAX_THREADS } from '../engine/thread-choice'

export interface SolveArgs {
  mode: 'solve' | 'schema' | 'help'
  configPath?: string
  outDir?: string
  force: boolean
  /** Absent: automatic choice. */
  engine?: EngineChoice
  /** Absent: automatic choice. */
  threads?: number
}

export const USAGE = `Usage:
  npm run solve -- CONFIG.json --out DIR [--force] [--engine E] [--threads N]   run a simulation, write DIR/manifest.json and one .npy per array
  npm run solve -- --schema                          print the JSON Schema of the configuration
Options:
  --out DIR    output directory (must not exist or be empty, unless --force replaces it)
  --force      replace an existing output directory
  --engine E   the step engine: auto (default: WebAssembly where it covers the options, else TypeScript), ts or wasm
  --threads N  threads on one run, 1 or 2 (default: 2 on a long plain run when a core is idle, else 1)
  --help       this text
Exit codes: 0 done, 1 the run failed, 2 bad input or over the resource limits, 130 interrupted.`

export class UsageError extends Error {}

const OPTIONS = {
  out: { type: 'string', short: 'o' },
  engine: { type: 'string' },
  threads: { type: 'string' },
  force: { type: 'boolean' },
  schema: { type: 'boolean' },
  help: { type: 'boolean', short: 'h' },
} as const

type OptionName = keyof typeof OPTIONS
const isOption = (name: string): name is OptionName => Object.hasOwn(OPTIONS, name)

export function parseArgs(argv: string[]): SolveArgs {
  const { tokens } = parseArgv({ args: argv, options: OPTIONS, allowPositionals: true, strict: false, tokens: true })
  const args: SolveArgs = { mode: 'solve', force: false }
  let configPath: string | undefined
  for (const t of tokens) {
    if (t.kind === 'positional') {
      if (configPath !== undefined) throw new UsageError(`Unexpected argument ${t.value}; give one configuration file`)
      configPath = t.value
      continue
    }
    if (t.kind !== 'option') continue
    if (!isOption(t.name)) throw new UsageError(`Unknown option ${t.rawName}`)
    if (OPTIONS[t.name].type === 'boolean') {
      if (t.inlineValue) throw new UsageError(`${t.rawName} takes no value`)
      if (t.name === 'force') args.force = true
      // --help wins over --schema whatever their order: asking for help never prints the schema.
      else if (t.name === 'help') args.mode = 'help'
      else if (args.mode !== 'help') args.mode = 'schema'
      continue
    }
    if (t.name === 'engine') {
      if (!ENGINE_CHOICES.includes(t.value as EngineChoice)) throw new UsageError(`--engine takes ${ENGINE_CHOICES.join(', ')}`)
      args.engine = t.value as EngineChoice
      continue
    }
    if (t.name === 'threads') {
      const n = Number(t.value)
      if (t.value === undefined || !/^\d+$/.test(t.value) || n < 1 || n > MAX_THREADS) throw new UsageError(`--threads takes a whole number from 1 to ${MAX_THREADS}`)
      args.threads = n
      continue
    }
    // Without '=', a value starting with '-' is most likely the next option, not a directory.
    if (t.value === undefined || (!t.inlineValue && t.value.startsWith('-'))) throw new UsageError(`${t.rawName} needs a directory (write --out=DIR for a name that starts with "-")`)
    args.outDir = t.value
  }
  args.configPath = configPath
  if (args.mode === 'solve') {
    if (args.configPath === undefined) throw new UsageError('Give a configuration file')
    if (args.outDir === undefined || args.outDir.length === 0) throw new UsageError('Give an output directory with --out DIR')
  }
  return args
}
