// Keeps a child process (the server under `npm start`) running: a crash is logged and the child started
// again after a short, growing pause; a crash loop (too many crashes within a window) is given up on
// with a line saying so, rather than spinning forever. A stop we asked for (SIGINT, SIGTERM) is passed
// on to the child and ends the supervision with the child's own exit.
// Plain Node, no dependencies, like the other scripts.

/** Defaults: give up after 5 crashes within 60 s; pauses of 1, 2, 4 … s, at most 10 s. */
export const SUPERVISE_DEFAULTS = { maxCrashes: 5, windowMs: 60_000, firstDelayMs: 1_000, maxDelayMs: 10_000 }

function describeExit(code, signal) {
  return signal ? `was killed by ${signal}` : `exited with code ${code}`
}

/**
 * spawnChild() starts the child and returns its ChildProcess. Resolves with the exit code the supervisor
 * should end with: the child's after a requested stop or a clean exit, 1 after giving up.
 */
export function supervise({ spawnChild, name = 'the server', log = (line) => console.error(`start: ${line}`), ...limits }) {
  const o = { ...SUPERVISE_DEFAULTS, ...limits }
  const crashes = [] // times of recent crashes
  let child = null
  let stopSignal = null
  let restartTimer = null
  let finish
  const done = new Promise((resolve) => (finish = resolve))

  const launch = () => {
    restartTimer = null
    child = spawnChild()
    child.once('error', (err) => log(`could not start ${name}: ${err.message}`))
    child.once('exit', (code, signal) => {
      child = null
      if (stopSignal) return finish(code ?? 0)
      if (code === 0) return finish(0) // it ended of its own accord, cleanly
      const now = Date.now()
      crashes.push(now)
      while (crashes.length && crashes[0] < now - o.windowMs) crashes.shift()
      if (crashes.length >= o.maxCrashes) {
        log(`${name} ${describeExit(code, signal)}; it crashed ${crashes.length} times within ${Math.round(o.windowMs / 1000)} s, so it is not restarted again (see the errors above)`)
        return finish(1)
      }
      const delayMs = Math.min(o.maxDelayMs, o.firstDelayMs * 2 ** (crashes.length - 1))
      log(`${name} ${describeExit(code, signal)}; restarting it in ${delayMs / 1000} s (${crashes.length} crash${crashes.length > 1 ? 'es' : ''} within ${Math.round(o.windowMs / 1000)} s; it is given up on at ${o.maxCrashes})`)
      restartTimer = setTimeout(launch, delayMs)
    })
  }
  launch()

  return {
    done,
    /** Passes a stop on to the child; during a restart pause, ends at once. */
    stop(signal = 'SIGTERM') {
      stopSignal = signal
      if (restartTimer) {
        clearTimeout(restartTimer)
        restartTimer = null
        finish(0)
      } else child?.kill(signal)
    },
    get pid() {
      return child?.pid ?? null
    },
  }
}
