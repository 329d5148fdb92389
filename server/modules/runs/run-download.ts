// GET /api/runs/:id/download: a ZIP streamed with archiver holding manifest.json, every array as NPY, the
// port traces also as CSV, a README.txt saying what each file holds and in which units, and plot_run.py, which
// draws the traces and maps with matplotlib (SVG, PDF or PNG) from those files.
import { readFileSync } from 'node:fs'
import type { Response } from 'express'
import { ZipArchive } from 'archiver'
import type { Db } from '../../db/client'
import type { Logger } from '../../logger'
import { arrayFileName, npyDescrOf, npyHeader, type RunManifest } from '../../../solver/index'
import { splitComplex } from './array-window'
import { findArray, type RunRow, type StoredArray } from './runs.repo'

const PORTS = ['pump_in', 'stokes_in', 'pump_out', 'stokes_out'] as const

/** Read once: it is part of the server's code, not of a run. */
const PLOT_SCRIPT = readFileSync(new URL('./assets/plot_run.py', import.meta.url), 'utf8')

/** ASCII units for spreadsheet headers. */
const asciiUnits = (u: string) => u.replace('√', 'sqrt')

function f64(a: StoredArray): Float64Array {
  const bytes = new Uint8Array(a.data)
  return new Float64Array(bytes.buffer, 0, bytes.byteLength / 8)
}

/** One CSV per channel: time, then re, im and power of each port trace. */
export function tracesCsv(time: StoredArray, traces: StoredArray[]): string {
  const t = f64(time)
  // Each interleaved complex trace split into its real and imaginary parts (strided views, array-window.ts).
  const cols = traces.map((a) => ({ name: a.name, ...splitComplex(f64(a)) }))
  const unit = asciiUnits(traces[0]?.units ?? 'W')
  const header = ['time (ns)', ...cols.flatMap((c) => [`${c.name} re (${unit})`, `${c.name} im (${unit})`, `${c.name} power (W)`])]
  const lines = [header.join(',')]
  for (let n = 0; n < t.length; n++) {
    const row = [String(t[n])]
    for (const c of cols) {
      const re = c.re[n]
      const im = c.im[n]
      row.push(String(re), String(im), String(re * re + im * im))
    }
    lines.push(row.join(','))
  }
  return lines.join('\n') + '\n'
}

export function readmeText(run: RunRow, manifest: RunManifest, csvFiles: string[]): string {
  const lines = [
    `Sonoweave run "${run.title}"`,
    `Run id ${run.id}, solver ${manifest.solverVersion}, finished ${run.finishedAt?.toISOString() ?? ''}`,
    '',
    'manifest.json  The run configuration, resource estimate, derived quantities, grid, figures of merit, warnings and one entry per array',
    '               (name, file, dtype, shape, units, description). figures.errorEstimate holds each figure\'s',
    '               estimated numerical error, keyed by the figure\'s path, from a rerun with twice the time step.',
    '',
    'NPY files (numpy: numpy.load("name.npy")). Little-endian, C order. Complex arrays (<c16) hold optical',
    'envelopes A in sqrt(W): |A|^2 is power in W. Maps are [time rows, z columns].',
    '',
    ...manifest.arrays.map((a) => `${a.file.padEnd(34)} ${a.npyDescr.padEnd(5)} shape (${a.shape.join(', ')})  ${asciiUnits(a.units)}  ${a.description}`),
    '',
    'CSV files (spreadsheets): one per channel, one row per time sample; for each port trace the real and',
    'imaginary parts of the envelope in sqrt(W) and the power |A|^2 in W. Units are in the header row.',
    ...csvFiles.map((f) => `  ${f}`),
    '',
    'plot_run.py    Draws the port traces and the space-time maps from these files with numpy and matplotlib:',
    '               python3 plot_run.py [--format svg|pdf|png]   (python3 plot_run.py --check only reads and checks)',
    '',
  ]
  return lines.join('\n')
}

export async function streamRunZip(res: Response, db: Db, run: RunRow, log: Logger): Promise<void> {
  const manifest = run.manifest!
  const zip = new ZipArchive({ zlib: { level: 6 } })
  zip.on('warning', (err) => log.warn({ err, runId: run.id }, 'zip warning'))
  zip.on('error', (err) => {
    log.error({ err, runId: run.id }, 'zip failed')
    res.destroy(err)
  })
  const safeTitle = run.title.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 60) || 'run'
  res.set({ 'Content-Type': 'application/zip', 'Content-Disposition': `attachment; filename="${safeTitle}-${run.id.slice(0, 8)}.zip"` })
  zip.pipe(res)
  zip.append(JSON.stringify(manifest, null, 2) + '\n', { name: 'manifest.json' })
  const byName = new Map<string, StoredArray>()
  // One array at a time keeps memory at the size of the largest array, not the whole run.
  for (const entry of manifest.arrays) {
    const a = await findArray(db, run.id, run.attempt, entry.name)
    if (!a) throw new Error(`array ${entry.name} of run ${run.id} is missing`)
    zip.append(Buffer.concat([npyHeader(npyDescrOf(a.dtype), a.shape), a.data]), { name: arrayFileName(a.name) })
    if (a.name === 'time_ns' || PORTS.some((p) => a.name.endsWith(`_${p}`))) byName.set(a.name, a)
  }
  const csvFiles: string[] = []
  const time = byName.get('time_ns')
  const channels = [...new Set([...byName.keys()].map((n) => /^(ch\d+)_/.exec(n)?.[1]).filter((c): c is string => !!c))]
  if (time) {
    for (const ch of channels) {
      const traces = PORTS.map((p) => byName.get(`${ch}_${p}`)).filter((a): a is StoredArray => !!a)
      const file = `${ch}_traces.csv`
      zip.append(tracesCsv(time, traces), { name: file })
      csvFiles.push(file)
    }
  }
  zip.append(readmeText(run, manifest, csvFiles), { name: 'README.txt' })
  zip.append(PLOT_SCRIPT, { name: 'plot_run.py', mode: 0o755 })
  await zip.finalize()
}
