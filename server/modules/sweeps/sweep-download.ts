// GET /api/sweeps/:id/download: a ZIP streamed with archiver holding the figures table (CSV, units in the
// header), the sweep definition, each finished point's manifest and, with ?arrays=1, each point's arrays
// as NPY, plus a README.txt saying what is where.
import type { Response } from 'express'
import { ZipArchive } from 'archiver'
import { axisLabel, type SweepDetail } from '@shared/api/sweeps'
import type { Db } from '../../db/client'
import type { Logger } from '../../logger'
import { arrayFileName, npyDescrOf, npyHeader, type RunManifest } from '../../../solver/index'
import { findArray, findRun } from '../runs/runs.repo'
import { sweepCsv } from './sweep-csv'

/** The folder of the point with 0-based `index`, numbered from 1 like the sweep page, the CSV and the mail. */
export const pointDir = (index: number) => `points/point-${String(index + 1).padStart(3, '0')}`

export function sweepReadme(s: SweepDetail, withArrays: boolean): string {
  return [
    `Sonoweave sweep "${s.title}"`,
    `Sweep id ${s.id}; ${s.pointCount} points over ${s.axes.map(axisLabel).join(' × ')}; status ${s.status}.`,
    '',
    'figures.csv     One row per point: the point number (from 1, as on the sweep page), the axis values, the run',
    '                status and id, then each figure of merit with its unit in the header ("1" = dimensionless),',
    '                each followed by its estimated numerical error in the same unit (from a rerun with twice the',
    '                time step). Empty cells: the run gives no such figure (e.g. no labelled data/read pulses) or no',
    '                estimate, or has not succeeded.',
    'sweep.json      The base configuration, the axes, the values on each axis and the metric columns.',
    `${pointDir(0)}/manifest.json  (one folder per finished point) the run's manifest: configuration, grid,`,
    '                figures of merit, warnings and one entry per array.',
    withArrays
      ? '                The same folder holds every array as NPY (numpy.load), little-endian, C order; complex arrays are\n                optical envelopes in sqrt(W).'
      : '                Arrays are not included; download again with arrays to get them, or download single runs.',
    '',
  ].join('\n')
}

/** Resolves once the archive has written the entry `name`, or has failed, or the client has gone. */
function entryWritten(zip: ZipArchive, name: string, res: Response): Promise<void> {
  return new Promise((resolve) => {
    if (res.destroyed) return resolve()
    const done = () => {
      zip.off('entry', onEntry)
      zip.off('error', done)
      res.off('close', done)
      resolve()
    }
    const onEntry = (e: { name: string }) => e.name === name && done()
    zip.on('entry', onEntry)
    zip.once('error', done)
    res.once('close', done)
  })
}

export async function streamSweepZip(res: Response, db: Db, s: SweepDetail, withArrays: boolean, log: Logger): Promise<void> {
  const zip = new ZipArchive({ zlib: { level: 6 } })
  zip.on('warning', (err) => log.warn({ err, sweepId: s.id }, 'zip warning'))
  zip.on('error', (err) => {
    log.error({ err, sweepId: s.id }, 'zip failed')
    res.destroy(err)
  })
  const safeTitle = s.title.replace(/[^A-Za-z0-9._-]+/g, '-').slice(0, 60) || 'sweep'
  res.set({ 'Content-Type': 'application/zip', 'Content-Disposition': `attachment; filename="${safeTitle}-${s.id.slice(0, 8)}.zip"` })
  zip.pipe(res)
  zip.append(sweepCsv(s), { name: 'figures.csv' })
  const { points: _points, ...definition } = s
  zip.append(JSON.stringify(definition, null, 2) + '\n', { name: 'sweep.json' })
  for (const p of s.points) {
    if (p.status !== 'succeeded') continue
    // One run at a time keeps memory at one run's manifest (and, with arrays, its largest array).
    const run = await findRun(db, p.runId)
    const manifest = run?.manifest as RunManifest | null | undefined
    if (!run || !manifest) continue
    zip.append(JSON.stringify(manifest, null, 2) + '\n', { name: `${pointDir(p.index)}/manifest.json` })
    if (!withArrays) continue
    for (const entry of manifest.arrays) {
      const a = await findArray(db, run.id, run.attempt, entry.name)
      if (!a) throw new Error(`array ${entry.name} of run ${run.id} is missing`)
      const name = `${pointDir(p.index)}/${arrayFileName(a.name)}`
      const written = entryWritten(zip, name, res)
      zip.append(Buffer.concat([npyHeader(npyDescrOf(a.dtype), a.shape), a.data]), { name })
      // append() only queues: without this wait every point's arrays would sit in memory at once.
      await written
      if (res.destroyed) return void zip.abort()
    }
  }
  zip.append(sweepReadme(s, withArrays), { name: 'README.txt' })
  await zip.finalize()
}
