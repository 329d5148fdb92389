// The solve command line (solver/cli/args.ts): the flags USAGE promises, and a clear message for each mistake.
import { describe, expect, it } from 'vitest'
import { parseArgs, UsageError } from '../../solver/cli/args'

const fails = (argv: string[]) => {
  try {
    parseArgs(argv)
  } catch (e) {
    expect(e).toBeInstanceOf(UsageError)
    return (e as Error).message
  }
  throw new Error(`${argv.join(' ')} was accepted`)
}

describe('solve command line', () => {
  it('reads a configuration file, --out in all three spellings, and --force', () => {
    expect(parseArgs(['c.json', '--out', 'dir'])).toEqual({ mode: 'solve', configPath: 'c.json', outDir: 'dir', force: false })
    expect(parseArgs(['--out=dir', 'c.json', '--force'])).toEqual({ mode: 'solve', configPath: 'c.json', outDir: 'dir', force: true })
    expect(parseArgs(['-o', 'dir', 'c.json'])).toMatchObject({ configPath: 'c.json', outDir: 'dir' })
    // A directory whose name starts with a dash needs the '=' form.
    expect(parseArgs(['c.json', '--out=-odd'])).toMatchObject({ outDir: '-odd' })
  })

  it('takes --schema and --help (or -h) without a configuration file; help wins over schema', () => {
    expect(parseArgs(['--schema']).mode).toBe('schema')
    expect(parseArgs(['--help']).mode).toBe('help')
    expect(parseArgs(['-h']).mode).toBe('help')
    expect(parseArgs(['--help', '--schema']).mode).toBe('help')
    expect(parseArgs(['--schema', '--help']).mode).toBe('help')
  })

  it('names an unknown option, long or short', () => {
    expect(fails(['c.json', '--out', 'd', '--verbose'])).toBe('Unknown option --verbose')
    expect(fails(['c.json', '--out', 'd', '-x'])).toBe('Unknown option -x')
  })

  it('says --out needs a directory when it has none or is followed by another option', () => {
    expect(fails(['c.json', '--out'])).toMatch(/^--out needs a directory/)
    expect(fails(['c.json', '--out', '--force'])).toMatch(/^--out needs a directory/)
    expect(fails(['c.json', '-o'])).toMatch(/^-o needs a directory/)
  })

  it('refuses a value on a switch, a second file, and a missing file or directory', () => {
    expect(fails(['c.json', '--out', 'd', '--force=yes'])).toBe('--force takes no value')
    expect(fails(['a.json', 'b.json', '--out', 'd'])).toMatch(/Unexpected argument b\.json/)
    expect(fails(['--out', 'd'])).toBe('Give a configuration file')
    expect(fails(['c.json'])).toBe('Give an output directory with --out DIR')
    expect(fails(['c.json', '--out='])).toBe('Give an output directory with --out DIR')
  })
})
