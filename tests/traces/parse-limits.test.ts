// The trace parser's limits on large and hostile files: a line-length limit instead of reading one huge
// line into memory, memory that stays within a small multiple of the file size, and line-by-line
// reading that is exact across the chunks the file is decoded in.
import { execFileSync } from 'node:child_process'
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { fileURLToPath } from 'node:url'
import { afterAll, describe, expect, it } from 'vitest'
import { buildTrace, parseTraceFile, TraceParseError } from '@shared/analysis/trace-parse'
import { TRACE_MAX_COLUMNS, TRACE_MAX_LINE_CHARS, TRACE_MAX_SAMPLES, TraceImportSettings } from '@shared/api/traces'
import { oneLineCsv, scopeCsv } from './big-files'

const ROOT = fileURLToPath(new URL('../..', import.meta.url))
const MB = 1024 * 1024
let millionRows: Buffer | null = null
/** The million-row scope export, made once for the tests that read it. */
const scopeMillion = () => (millionRows ??= scopeCsv(1_000_000))

function refusal(bytes: Uint8Array): TraceParseError {
  try {
    parseTraceFile(bytes)
  } catch (err) {
    expect(err).toBeInstanceOf(TraceParseError)
    return err as TraceParseError
  }
  throw new Error('the file was accepted')
}

describe('line and size limits', () => {
  it('refuses a 20 MB file that is one line with no line break, naming the line-length limit', () => {
    const e = refusal(oneLineCsv(20 * MB))

    expect(e.message).toMatch(/^Line 1 is longer than 65,536 characters, the line-length limit for trace files/)
    expect(e.where.line).toBe(1)
  })

  it('reads a metadata line of exactly the limit and refuses one a character longer', () => {
    const data = '0,1\n1,2\n2,3\n'
    const atLimit = `# ${'x'.repeat(TRACE_MAX_LINE_CHARS - 2)}\n${data}`
    expect(parseTraceFile(Buffer.from(atLimit)).rowCount).toBe(3)

    const e = refusal(Buffer.from(`# ${'x'.repeat(TRACE_MAX_LINE_CHARS - 1)}\n${data}`))
    expect(e.message).toMatch(/^Line 1 is longer than/)
  })

  it('refuses data lines with more columns than a trace file may have', () => {
    const row = (k: number) => Array.from({ length: TRACE_MAX_COLUMNS + 1 }, (_, c) => k + c).join(',')

    const e = refusal(Buffer.from([row(0), row(1), row(2)].join('\n')))

    expect(e.message).toMatch(new RegExp(`^Line 1 holds more than ${TRACE_MAX_COLUMNS} numbers; a trace file may have at most ${TRACE_MAX_COLUMNS} columns`))
  })

  it('stops at the first row past the sample limit, naming its line', () => {
    const e = refusal(scopeCsv(TRACE_MAX_SAMPLES + 1))

    expect(e.message).toMatch(`The file holds more than ${TRACE_MAX_SAMPLES} samples (line ${TRACE_MAX_SAMPLES + 2} is one too many)`)
  })
})

describe('reading line by line', () => {
  /** Pads with metadata so the byte at `at` is the `offset`-th byte of the text that follows. */
  const padTo = (at: number) => `# ${'p'.repeat(at - 3)}\n`

  it('keeps a CRLF split across the 64 KiB decoding chunks as one line break', () => {
    // The header line's CR is the last byte of the first chunk, its LF the first of the second.
    const text = `${padTo(64 * 1024 - 1 - 'time (ns),P (W)'.length)}time (ns),P (W)\r\n0,1\r\n1,2\r\n2,3\r\n`
    expect(Buffer.from(text).indexOf('\r\n')).toBe(64 * 1024 - 1)

    const t = parseTraceFile(Buffer.from(text))

    expect(t.headerLine).toBe(2)
    expect(Array.from(t.rowLines)).toEqual([3, 4, 5])
    expect(t.data[1]).toEqual(Float64Array.from([1, 2, 3]))
  })

  it('decodes a two-byte "µ" split across the chunks', () => {
    const head = 'time (µs),P (W)'
    // The µ (0xC2 0xB5) straddles the chunk boundary.
    const text = `${padTo(64 * 1024 - 'time ('.length - 1)}${head}\n0,1\n1,2\n2,3\n`
    expect(Buffer.from(text).indexOf(Buffer.from('µ'))).toBe(64 * 1024 - 1)

    const t = parseTraceFile(Buffer.from(text))

    expect(t.columns[0].name).toBe('time (µs)')
    expect(t.suggestions.timeUnit).toBe('us')
  })

  it('reads the whole file as windows-1252 when its first Latin-1 byte comes after the first chunk', () => {
    // 300 metadata lines (≈75 kB of ASCII), then a header writing µ as the Latin-1 byte 0xB5.
    const metadata = Array.from({ length: 300 }, (_, i) => `# note ${i}: ${'x'.repeat(240)}`).join('\n')
    const bytes = Buffer.concat([Buffer.from(`${metadata}\nTime (`), Buffer.from([0xb5]), Buffer.from('s),P (mW)\n0,1\n1,2\n2,3\n')])
    expect(bytes.indexOf(0xb5)).toBeGreaterThan(64 * 1024)

    const t = parseTraceFile(bytes)

    expect(t.columns.map((c) => c.name)).toEqual(['Time (µs)', 'P (mW)'])
    expect(t.suggestions).toMatchObject({ timeUnit: 'us', timeUnitSource: 'header', signalUnit: 'mW' })
    expect(t.metadata).toHaveLength(300)
  })
})

describe('memory', () => {
  const dir = mkdtempSync(join(tmpdir(), 'trace-memory-'))
  afterAll(() => rmSync(dir, { recursive: true, force: true }))

  /** Peak resident growth of a fresh process parsing `bytes` (tests/traces/parse-memory-probe.ts). */
  function parsePeak(name: string, bytes: Buffer) {
    const file = join(dir, name)
    writeFileSync(file, bytes)
    const out = execFileSync(process.execPath, ['--expose-gc', '--import', 'tsx', 'tests/traces/parse-memory-probe.ts', file], { cwd: ROOT, encoding: 'utf8', timeout: 300_000 })
    const r = JSON.parse(out.trim().split('\n').pop()!) as { fileBytes: number; rssBefore: number; peakBefore: number; peakAfter: number; outcome: string }
    // The peak is only the parse's when the process had not been higher before it started.
    expect(r.peakBefore - r.rssBefore).toBeLessThan(32 * MB)
    return { ...r, growth: r.peakAfter - r.rssBefore }
  }

  // The bound: three times the file plus a fixed 48 MB for the runtime's own growth. A parse that kept
  // every line, or every field, as a string took 100–130 times the file (about 450 MB for 4 MB).
  const bound = (fileBytes: number) => 3 * fileBytes + 48 * MB

  it('refuses a 4 MB one-line file without taking memory in proportion to the line', () => {
    const r = parsePeak('one-line.csv', oneLineCsv(4 * MB))

    expect(r.outcome).toMatch(/line-length limit/)
    expect(r.growth).toBeLessThan(bound(r.fileBytes))
  })

  it('parses a million-row file (≈21 MB) within three times its size plus a fixed allowance', () => {
    const r = parsePeak('scope.csv', scopeMillion())

    expect(r.outcome).toBe('parsed 1000000 samples')
    expect(r.growth).toBeLessThan(bound(r.fileBytes))
  })
})

describe('the parsed million-row file', () => {
  it('holds the numbers as written', () => {
    const t = parseTraceFile(scopeMillion())
    const b = buildTrace(t, TraceImportSettings.parse({ name: 'x', signalColumns: [1] }))

    expect(b.timeUnit).toBe('s')
    expect(b.timeNs.length).toBe(1_000_000)
    expect(b.timeNs[999_999]).toBeCloseTo(99_999.9, 6)
    // sin(2π·i/10) at i = 3: 1 + 0.951056… (as printed with 7 significant digits).
    expect(b.signals[0].values[3]).toBeCloseTo(1.951057e-3, 9)
  })
})
