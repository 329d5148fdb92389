// Spawns the solve CLI the way `npm run solve` does, without npm in between (npm would swallow signals).
import { spawn, type ChildProcess } from 'node:child_process'
import { fileURLToPath } from 'node:url'

export const REPO = fileURLToPath(new URL('../..', import.meta.url))

export interface CliRun {
  code: number | null
  signal: NodeJS.Signals | null
  stdout: string
  stderr: string
}

export function startCli(args: string[]): { child: ChildProcess; done: Promise<CliRun>; output: () => string } {
  const child = spawn(process.execPath, ['--import', 'tsx', 'solver/cli/solve.ts', ...args], { cwd: REPO, stdio: ['ignore', 'pipe', 'pipe'] })
  let stdout = ''
  let stderr = ''
  child.stdout!.on('data', (d) => (stdout += d))
  child.stderr!.on('data', (d) => (stderr += d))
  const done = new Promise<CliRun>((resolve) => child.on('close', (code, signal) => resolve({ code, signal, stdout, stderr })))
  return { child, done, output: () => stdout }
}

export const runCli = (args: string[]) => startCli(args).done
