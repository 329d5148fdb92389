// The trace parser against a corpus of small files in the layouts instruments and scripts write. Expected
// arrays are the numbers typed into each file; the NPY files were written by numpy's own np.save (numpy
// 2.4, the reference implementation of the format), so they also check our reader against numpy.
import { readFileSync } from 'node:fs'
import { join } from 'node:path'
import { describe, expect, it } from 'vitest'
import { buildTrace, parseTraceFile, TraceParseError, type ParsedTable } from '@shared/analysis/trace-parse'
import { TraceImportSettings, type TraceImportSettingsInput } from '@shared/api/traces'

const corpus = (name: string) => new Uint8Array(readFileSync(join(__dirname, 'corpus', name)))
const malformed = (name: string) => new Uint8Array(readFileSync(join(__dirname, 'malformed', name)))
const cols = (t: ParsedTable) => t.data.map((c) => Array.from(c))
const build = (t: ParsedTable, s: Partial<TraceImportSettingsInput>) => buildTrace(t, TraceImportSettings.parse({ name: 'x', signalColumns: [1], ...s }))

function expectClose(actual: ArrayLike<number>, expected: number[], digits = 12) {
  expect(actual.length).toBe(expected.length)
  expected.forEach((e, i) => expect(actual[i]).toBeCloseTo(e, digits))
}

describe('trace parser corpus', () => {
  it('reads an oscilloscope CSV with a metadata block, a header and CRLF line ends; time unit from the metadata', () => {
    const t = parseTraceFile(corpus('01-scope-metadata-crlf.csv'))

    expect(t.delimiter).toBe('comma')
    expect(t.headerLine).toBe(6)
    expect(t.columns.map((c) => c.name)).toEqual(['TIME', 'CH1'])
    expect(cols(t)).toEqual([
      [-2e-10, -1e-10, 0, 1e-10, 2e-10],
      [0.0012, 0.001, 0.052, 0.104, 0.078],
    ])
    expect(t.metadata).toContainEqual({ key: 'Sample Interval', value: '1e-10', line: 2 })
    expect(t.suggestions).toMatchObject({ timeColumn: 0, timeUnit: 's', timeUnitSource: 'metadata', signalColumns: [1] })
    expectClose(build(t, { timeUnit: 's' }).timeNs, [-0.2, -0.1, 0, 0.1, 0.2])
  })

  it('reads semicolons with decimal commas, µs and mW from the header', () => {
    const t = parseTraceFile(corpus('02-semicolon-decimal-comma.csv'))

    expect([t.delimiter, t.decimalSeparator]).toEqual(['semicolon', 'comma'])
    expect(cols(t)).toEqual([
      [0, 0.001, 0.002, 0.003],
      [0.5, 1.25, 2.0, 0.75],
    ])
    expect(t.suggestions).toMatchObject({ timeUnit: 'us', timeUnitSource: 'header', signalUnit: 'mW' })
    const b = build(t, { timeUnit: 'us', signalUnit: 'mW' })
    expectClose(b.timeNs, [0, 1, 2, 3])
    expectClose(b.signals[0].values, [0.5e-3, 1.25e-3, 2e-3, 0.75e-3], 15)
    expect(b.signals[0].unit).toBe('W')
  })

  it('reads tab-separated text with two signal columns', () => {
    const t = parseTraceFile(corpus('03-tab-three-columns.tsv'))

    expect(t.delimiter).toBe('tab')
    expect(t.columns.map((c) => c.name)).toEqual(['time_ns', 'pump_W', 'stokes_W'])
    expect(t.suggestions).toMatchObject({ timeColumn: 0, timeUnit: 'ns', signalColumns: [1, 2], signalUnit: 'W' })
    expect(cols(t)[2]).toEqual([0, 0.001, 0.003, 0.002])
  })

  it('reads whitespace columns under #-comment lines, the last of them the header', () => {
    const t = parseTraceFile(corpus('04-whitespace-comments.dat'))

    expect(t.delimiter).toBe('whitespace')
    expect(t.columns.map((c) => c.name)).toEqual(['t (ps)', 'P (W)'])
    expect(t.metadata).toContainEqual({ key: 'wavelength', value: '1550 nm', line: 2 })
    expect(cols(t)).toEqual([
      [0, 10, 20, 30],
      [1e-3, 2.5e-3, 4e-3, 1.5e-3],
    ])
    expect(t.suggestions.timeUnit).toBe('ps')
  })

  it('skips blank lines inside and after the data', () => {
    const t = parseTraceFile(corpus('05-blank-lines.csv'))

    expect(cols(t)).toEqual([
      [0, 1, 2, 3],
      [0.1, 0.2, 0.3, 0.25],
    ])
    expect(Array.from(t.rowLines)).toEqual([3, 5, 6, 9])
  })

  it('ignores a trailing delimiter on every line', () => {
    const t = parseTraceFile(corpus('06-trailing-delimiter.csv'))

    expect(t.columns).toHaveLength(2)
    expect(cols(t)).toEqual([
      [0, 1e-9, 2e-9],
      [1e-3, 2e-3, 3e-3],
    ])
  })

  it('reads unit suffixes written after the numbers and takes them as unit hints', () => {
    const t = parseTraceFile(corpus('07-unit-suffixes.csv'))

    expect(cols(t)).toEqual([
      [0, 0.2, 0.4],
      [1.2, 2.4, 3.6],
    ])
    expect(t.columns.map((c) => c.unitHint)).toEqual(['ns', 'mW'])
    expect(t.suggestions).toMatchObject({ timeUnit: 'ns', signalUnit: 'mW' })
  })

  it('reads a file with no header, naming the columns by number', () => {
    const t = parseTraceFile(corpus('08-no-header.csv'))

    expect(t.headerLine).toBeNull()
    expect(t.columns.map((c) => c.name)).toEqual(['Column 1', 'Column 2'])
    expect(cols(t)[1]).toEqual([0.5, 0.7, 0.9, 0.4])
  })

  it('unquotes spreadsheet-style quoted fields (CRLF)', () => {
    const t = parseTraceFile(corpus('09-quoted-crlf.csv'))

    expect(t.columns.map((c) => c.name)).toEqual(['Time (s)', 'Signal (V)'])
    expect(cols(t)).toEqual([
      [0, 5e-11, 1e-10],
      [0.01, 0.02, 0.015],
    ])
    const b = build(t, { timeUnit: 's', signalUnit: 'V', responsivityVPerW: 100 })
    expectClose(b.signals[0].values, [1e-4, 2e-4, 1.5e-4], 15)
  })

  it('reads whitespace columns with decimal commas and _unit suffixes in the header', () => {
    const t = parseTraceFile(corpus('10-whitespace-decimal-comma.txt'))

    expect([t.delimiter, t.decimalSeparator]).toEqual(['whitespace', 'comma'])
    expect(cols(t)).toEqual([
      [0, 0.5, 1],
      [1.5, 2.5, 3.5],
    ])
    expect(t.suggestions).toMatchObject({ timeUnit: 'ns', signalUnit: 'mW' })
  })

  it('reads a Latin-1 file whose header writes µs with byte 0xB5', () => {
    const t = parseTraceFile(corpus('11-latin1-micro.csv'))

    expect(t.columns[0].name).toBe('Time (µs)')
    expect(t.suggestions).toMatchObject({ timeUnit: 'us', signalUnit: 'mV' })
    expect(cols(t)[1]).toEqual([1, 2, 3])
  })

  it('is not misled by metadata lines holding numbers, and keeps key: value metadata', () => {
    const t = parseTraceFile(corpus('12-metadata-date-semicolon.csv'))

    expect(t.dataStartLine).toBe(6)
    expect(t.columns.map((c) => c.name)).toEqual(['time_us', 'det_a_V', 'det_b_V'])
    expect(t.metadata).toContainEqual({ key: 'Responsivity', value: '800 V/W', line: 2 })
    expect(cols(t)[1]).toEqual([0, 0.4, 0.8, 0.2])
    // Baseline: the mean over 0–0.015 µs (first two samples) is subtracted.
    const b = build(t, { timeUnit: 'us', signalColumns: [1, 2], signalUnit: 'V', responsivityVPerW: 800, baseline: { startNs: 0, endNs: 15 } })
    expectClose(b.signals[0].values, [-0.2 / 800, 0.2 / 800, 0.6 / 800, 0], 15)
    expect(b.signals[1].baseline).toBeCloseTo(0.2 / 800, 15)
  })

  it('reads old Mac line ends (CR only)', () => {
    const t = parseTraceFile(corpus('13-old-mac-cr.csv'))

    expect(cols(t)).toEqual([
      [0, 1, 2],
      [1, 2, 3],
    ])
  })

  it('reads a numpy float64 array of shape (n, 2) as time + signal', () => {
    const t = parseTraceFile(corpus('14-columns-f8.npy'))

    expect(t.format).toBe('npy')
    expect(cols(t)).toEqual([
      [0, 0.1, 0.2, 0.3, 0.4],
      [0, 1, 4, 9, 16],
    ])
  })

  it('reads a big-endian float32 array of shape (2, n), rows as columns', () => {
    const t = parseTraceFile(corpus('15-rows-f4-bigendian.npy'))

    expect(t.columns).toHaveLength(2)
    expectClose(t.data[0], [0, 0.1, 0.2, 0.3, 0.4], 6)
    expectClose(t.data[1], [1, 0.5, 0.25, 0.125, 0.0625], 12)
  })

  it('reads a 1-D int16 array as one signal and takes time from the sample interval', () => {
    const t = parseTraceFile(corpus('16-one-signal-i2.npy'))

    expect(t.suggestions.timeColumn).toBeNull()
    const b = build(t, { timeColumn: null, sampleIntervalNs: 0.25, signalColumns: [0] })
    expectClose(b.timeNs, [0, 0.25, 0.5, 0.75, 1, 1.25])
    expect(Array.from(b.signals[0].values)).toEqual([3, -1, 4, 1, -5, 9])
  })

  it('reads a Fortran-ordered array in the right element order', () => {
    const t = parseTraceFile(corpus('17-fortran-order.npy'))

    expectClose(t.data[2], [0, 0.3, 0.6, 0.9, 1.2])
  })
})

describe('malformed files are refused with what and where', () => {
  const refusal = (bytes: Uint8Array, settings?: Partial<TraceImportSettingsInput>) => {
    try {
      const t = parseTraceFile(bytes)
      build(t, settings ?? {})
    } catch (err) {
      expect(err).toBeInstanceOf(TraceParseError)
      return err as TraceParseError
    }
    throw new Error('the file was accepted')
  }

  it('a file without numeric data', () => {
    expect(refusal(malformed('no-numeric-data.csv')).message).toMatch(/No numeric data found/)
  })

  it('ragged rows, naming the line', () => {
    const e = refusal(malformed('ragged-rows.csv'))
    expect(e.message).toMatch(/Line 4 has 2 fields but the data starting at line 2 have 3 columns/)
    expect(e.where.line).toBe(4)
  })

  it('time that goes backwards, naming the row and line', () => {
    const e = refusal(malformed('non-monotonic-time.csv'), { timeUnit: 'ns' })
    expect(e.message).toMatch(/Time is not increasing at row 4 \(line 5\): 2 follows 3/)
  })

  it('a value too large for a double, naming the row and column (1e999 reads as Infinity)', () => {
    const e = refusal(Buffer.from('time_ns,power_mW\n0,1\n1,1e999\n2,3\n'), { timeUnit: 'ns', signalUnit: 'mW' })
    expect(e.message).toMatch(/signal value at row 2 \(line 3\), column "power_mW" \(Infinity\) is too large/)
    expect(e.where).toMatchObject({ line: 3, column: 2 })
    // A finite time that overflows only once converted to ns is refused too.
    expect(refusal(Buffer.from('t,p\n0,1\n1e300,2\n'), { timeUnit: 's' }).message).toMatch(/time value at row 2/)
  })

  it('a word inside the data', () => {
    expect(refusal(malformed('text-in-data.csv')).message).toMatch(/Line 3, column 2: "abc" is not a number/)
  })

  it('binary garbage, naming the offset of the first binary byte', () => {
    const e = refusal(malformed('binary-garbage.bin'))
    expect(e.message).toMatch(/not a text file or an NPY array: binary byte 0x[0-9a-f]{2} at offset \d+/)
    expect(e.where.byteOffset).toBeLessThanOrEqual(10)
  })

  it('a truncated NPY file', () => {
    expect(refusal(malformed('truncated.npy')).message).toMatch(/promises 80 bytes of data .* but the file holds 68/)
  })

  it('a complex NPY array', () => {
    expect(refusal(malformed('complex.npy')).message).toMatch(/dtype <c16 is not supported/)
  })

  it('a baseline window outside the trace', () => {
    const e = refusal(corpus('08-no-header.csv'), { timeUnit: 'ns', baseline: { startNs: 10, endNs: 20 } })
    expect(e.message).toMatch(/baseline window 10–20 ns holds no samples; the trace spans 0.00000–3.00000 ns/)
  })
})
