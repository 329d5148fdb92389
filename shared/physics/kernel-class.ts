// The kernel class of a run: which code advanced it (engine, thread count and the interaction kernel the
// driver chose). Runs of one class cost the same per cell-update, so the resource estimate calibrates its
// speed per class (shared/physics/resource-estimate.ts), and the run's manifest records the class it ran.
import { z } from 'zod'

/**
 * The interaction kernel: the plain SVEA fast path, its flat Kerr, thermal-noise, Kerr-with-noise and
 * second-order-acoustic (with or without Kerr) variants, the flat kernel of several channels (its classes: without
 * options, with Kerr, with noise, with both, with the second-order term), the per-node kernel of a longitudinal
 * profile, the multi-wave solver, and the general reference kernel, which the solver takes only when told to (the
 * flat kernels are checked against it bit for bit).
 */
export const KernelPath = z.enum(['plain', 'kerr', 'noise', 'kerr-noise', 'higher-order', 'higher-order-kerr', 'channels', 'channels-kerr', 'channels-noise', 'channels-kerr-noise', 'channels-higher-order', 'profile', 'network', 'general'])
export type KernelPath = z.infer<typeof KernelPath>

export const KernelClass = z.object({
  engine: z.enum(['ts', 'wasm']).describe('The step engine: the TypeScript kernels or the WebAssembly engine'),
  threads: z.number().int().min(1).max(8).describe('Threads that advanced the run'),
  path: KernelPath,
})
export type KernelClass = z.infer<typeof KernelClass>

/** A stable text key of a class ("wasm/plain/2"), the one the calibration groups its observations by. */
export function kernelKey(k: KernelClass): string {
  return `${k.engine}/${k.path}/${k.threads}`
}

const PATH_WORDS: Record<KernelPath, string> = {
  plain: 'plain scheme',
  kerr: 'Kerr effect',
  noise: 'thermal noise',
  'kerr-noise': 'Kerr effect with thermal noise',
  'higher-order': 'second-order acoustic equation',
  'higher-order-kerr': 'second-order acoustic equation with the Kerr effect',
  channels: 'several channels',
  'channels-kerr': 'several channels with the Kerr effect',
  'channels-noise': 'several channels with thermal noise',
  'channels-kerr-noise': 'several channels with the Kerr effect and thermal noise',
  'channels-higher-order': 'several channels with the second-order acoustic equation',
  profile: 'properties varying along the length',
  network: 'several waves',
  general: 'general reference kernel',
}

/** The class in words a user reads ("WebAssembly engine, plain scheme, 2 threads"). */
export function describeKernel(k: KernelClass): string {
  const engine = k.engine === 'wasm' ? 'WebAssembly engine' : 'TypeScript engine'
  return `${engine}, ${PATH_WORDS[k.path]}, ${k.threads} thread${k.threads > 1 ? 's' : ''}`
}
