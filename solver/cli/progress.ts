// Progress display: a redrawn bar on a terminal, plain lines every 10 % when output goes to a file or pipe.

const BAR_WIDTH = 30
const LINE_STEP = 0.1

export interface ProgressSink {
  update(fraction: number): void
  done(): void
}

export function progressSink(stream: NodeJS.WriteStream, now: () => number = Date.now): ProgressSink {
  const t0 = now()
  const eta = (f: number) => {
    const elapsedS = (now() - t0) / 1000
    return f > 0.01 ? ` ETA ${((elapsedS * (1 - f)) / f).toFixed(1)} s` : ''
  }
  if (stream.isTTY) {
    let drawn = false
    return {
      update(f) {
        const filled = Math.round(f * BAR_WIDTH)
        stream.write(`\r[${'#'.repeat(filled)}${'-'.repeat(BAR_WIDTH - filled)}] ${(100 * f).toFixed(0).padStart(3)} %${eta(f)}   `)
        drawn = true
      },
      done() {
        if (drawn) stream.write('\n')
      },
    }
  }
  let next = LINE_STEP
  return {
    update(f) {
      if (f + 1e-12 < next) return
      stream.write(`progress ${(100 * f).toFixed(0)} %${eta(f)}\n`)
      while (next <= f + 1e-12) next += LINE_STEP
    },
    done() {},
  }
}
