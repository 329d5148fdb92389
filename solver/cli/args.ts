// Command line of `npm run solve -- config.json --out dir/ [--force]` and `npm run solve -- --schema`.

export interface SolveArgs {
  mode: 'solve' | 'schema' | 'help'
  configPath?: string
  outDir?: string
  force: boolean
}

export const USAGE = `Usage:
  npm run solve -- CONFIG.json --out DIR [--force]   run a simulation, write DIR/manifest.json and one .npy per array
  npm run solve -- --schema                          print the JSON Schema of the configuration
Options:
  --out DIR    output directory (must not exist or be empty, unless --force replaces it)
  --force      replace an existing output directory
  --help       this text
Exit codes: 0 done, 1 the run failed, 2 bad input or over the resource limits, 130 interrupted.`

export class UsageError extends Error {}

export function parseArgs(argv: string[]): SolveArgs {
  const args: SolveArgs = { mode: 'solve', force: false }
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]
    if (a === '--schema') args.mode = 'schema'
    else if (a === '--help' || a === '-h') args.mode = 'help'
    else if (a === '--force') args.force = true
    else if (a === '--out' || a === '-o') {
      const v = argv[++i]
      if (v === undefined || v.startsWith('--')) throw new UsageError('--out needs a directory')
      args.outDir = v
    } else if (a.startsWith('--out=')) args.outDir = a.slice('--out='.length)
    else if (a.startsWith('-')) throw new UsageError(`Unknown option ${a}`)
    else if (args.configPath === undefined) args.configPath = a
    else throw new UsageError(`Unexpected argument ${a}; give one configuration file`)
  }
  if (args.mode === 'solve') {
    if (args.configPath === undefined) throw new UsageError('Give a configuration file')
    if (args.outDir === undefined || args.outDir.length === 0) throw new UsageError('Give an output directory with --out DIR')
  }
  return args
}
