import { describe, expect, it } from 'vitest'
import { progressSink } from './progress'

function fakeStream(isTTY: boolean) {
  const chunks: string[] = []
  return { chunks, stream: { isTTY, write: (s: string) => (chunks.push(s), true) } as unknown as NodeJS.WriteStream }
}

describe('progressSink', () => {
  it('redraws one bar in place on a terminal and ends the line when done', () => {
    const { chunks, stream } = fakeStream(true)
    let t = 0
    const p = progressSink(stream, () => t)
    t = 1000
    p.update(0.5)
    p.done()
    expect(chunks[0]).toMatch(/^\r\[#{15}-{15}\] {2}50 % ETA 1\.0 s/)
    expect(chunks[1]).toBe('\n')
  })

  it('prints plain lines only at each further 10 % when not a terminal', () => {
    const { chunks, stream } = fakeStream(false)
    const p = progressSink(stream, () => 0)
    for (let k = 1; k <= 100; k++) p.update(k / 100)
    p.done()
    expect(chunks).toHaveLength(10)
    expect(chunks.every((c) => c.startsWith('progress ') && c.endsWith('\n'))).toBe(true)
    expect(chunks[9]).toMatch(/^progress 100 %/)
  })
})
