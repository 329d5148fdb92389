// Writes a run directory all-or-nothing: files go to a sibling staging directory that is renamed into place
// only when every file is complete, so an interrupted or failed write leaves no half-written run behind.
import { closeSync, existsSync, mkdirSync, openSync, readdirSync, renameSync, rmSync, statSync, writeFileSync, writeSync } from 'node:fs'
import { basename, dirname, join, resolve } from 'node:path'
import { npyParts } from '../io/npy'
import { MANIFEST_FILE, type RunManifest } from '../io/manifest'

export class OutputDirError extends Error {}

/** Refuses an output directory that holds files, unless `force`; call before running. */
export function checkOutputDir(outDir: string, force: boolean): void {
  const path = resolve(outDir)
  if (!existsSync(path)) {
    if (!existsSync(dirname(path))) throw new OutputDirError(`The parent folder of ${outDir} does not exist`)
    return
  }
  if (!statSync(path).isDirectory()) throw new OutputDirError(`${outDir} exists and is not a directory`)
  if (readdirSync(path).length > 0 && !force) throw new OutputDirError(`${outDir} is not empty; use --force to replace it`)
}

export function stagingDirFor(outDir: string): string {
  const path = resolve(outDir)
  return join(dirname(path), `.${basename(path)}.partial-${process.pid}`)
}

/**
 * Writes manifest.json and one NPY per array. `interrupted()` is polled between files; when it turns true the
 * staging directory is removed and false is returned.
 */
export function writeRunDir(
  outDir: string,
  manifest: RunManifest,
  arrays: Record<string, Float64Array | Float32Array>,
  interrupted: () => boolean,
): boolean {
  const staging = stagingDirFor(outDir)
  rmSync(staging, { recursive: true, force: true })
  mkdirSync(staging)
  try {
    for (const a of manifest.arrays) {
      if (interrupted()) {
        rmSync(staging, { recursive: true, force: true })
        return false
      }
      const data = arrays[a.name]
      if (!data) throw new Error(`The result has no data for array ${a.name}`)
      const [head, body] = npyParts({ descr: a.npyDescr, shape: a.shape, data })
      const fd = openSync(join(staging, a.file), 'w')
      try {
        writeSync(fd, head)
        writeSync(fd, body)
      } finally {
        closeSync(fd)
      }
    }
    writeFileSync(join(staging, MANIFEST_FILE), JSON.stringify(manifest, null, 2) + '\n')
    if (interrupted()) {
      rmSync(staging, { recursive: true, force: true })
      return false
    }
    const path = resolve(outDir)
    rmSync(path, { recursive: true, force: true })
    renameSync(staging, path)
    return true
  } catch (e) {
    rmSync(staging, { recursive: true, force: true })
    throw e
  }
}
