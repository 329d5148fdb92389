// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest'
import { effectScope, nextTick, ref } from 'vue'
import type { RunBlockEvent } from '@shared/api/runs'
import { useRunEvents, type EventSourceLike } from './useRunEvents'

class FakeSource implements EventSourceLike {
  listeners = new Map<string, Array<(e: MessageEvent) => void>>()
  onerror: ((e: Event) => void) | null = null
  onopen: ((e: Event) => void) | null = null
  readyState = 1
  closed = false
  constructor(readonly url: string) {}
  addEventListener(type: string, l: (e: MessageEvent) => void) {
    this.listeners.set(type, [...(this.listeners.get(type) ?? []), l])
  }
  close() {
    this.closed = true
    this.readyState = 2
  }
  emit(type: string, data: unknown) {
    for (const l of this.listeners.get(type) ?? []) l(new MessageEvent(type, { data: JSON.stringify(data) }))
  }
}

const b64 = (values: number[]) => btoa(String.fromCharCode(...new Uint8Array(new Float32Array(values).buffer)))
/** A block of `rowCount` rows × 2 columns whose pump map holds `fill` (Stokes 2·fill, acoustic 3·fill). */
function block(attempt: number, blockIndex: number, rowStart: number, rowCount: number, fill: number): RunBlockEvent {
  const n = rowCount * 2
  return {
    attempt,
    blockIndex,
    rowStart,
    rowCount,
    cols: 2,
    maps: { pumpPowerW: b64(Array(n).fill(fill)), stokesPowerW: b64(Array(n).fill(2 * fill)), acousticPhononsPerM: b64(Array(n).fill(3 * fill)) },
  }
}

function setup() {
  const sources: FakeSource[] = []
  const scope = effectScope()
  const ev = scope.run(() =>
    useRunEvents(ref('run-1'), {
      expectedSize: () => ({ rows: 6, cols: 2 }),
      createSource: (url) => {
        const s = new FakeSource(url)
        sources.push(s)
        return s
      },
    }),
  )!
  return { ev, source: sources[0], scope }
}

describe('useRunEvents', () => {
  it('forgets the previous run’s status, attempt and progress when the page moves to another run', async () => {
    const sources: FakeSource[] = []
    const runId = ref<string | null>('run-1')
    const scope = effectScope()
    const ev = scope.run(() => useRunEvents(runId, { createSource: (url) => (sources.push(new FakeSource(url)), sources.at(-1)!) }))!
    sources[0].emit('status', { status: 'running', attempt: 2, error: null })
    sources[0].emit('status', { status: 'succeeded', attempt: 2, error: null })
    expect(ev.status.value).toBe('succeeded')

    // The page shows a clone: first without a stream (its record loads), then with the clone's stream.
    runId.value = null
    await nextTick()
    expect([ev.status.value, ev.attempt.value, ev.progress.value]).toEqual([null, 0, 0])
    runId.value = 'run-2'
    await nextTick()
    expect(ev.status.value).toBeNull()
    sources[1].emit('status', { status: 'queued', attempt: 1, error: null })
    expect(sources[1].url).toBe('/api/runs/run-2/events')
    expect(ev.status.value).toBe('queued')
    scope.stop()
  })

  it('opens the run event stream and follows status and progress', async () => {
    const { ev, source, scope } = setup()
    expect(source.url).toBe('/api/runs/run-1/events')
    source.emit('status', { status: 'running', attempt: 1, error: null })
    source.emit('progress', { attempt: 1, fraction: 0.4 })
    await nextTick()
    expect(ev.status.value).toBe('running')
    expect(ev.progress.value).toBe(0.4)
    scope.stop()
    expect(source.closed).toBe(true)
  })

  it('places blocks by their rows whatever order they come in, and ignores a replayed block', () => {
    const { ev, source } = setup()
    source.emit('status', { status: 'running', attempt: 1, error: null })
    source.emit('block', block(1, 1, 2, 2, 5))
    source.emit('block', block(1, 0, 0, 2, 7))
    // A reconnect replays block 1; a replay must not count twice or overwrite.
    source.emit('block', block(1, 1, 2, 2, 99))
    const b = ev.buffer.value
    expect(Array.from(b.maps.pumpPowerW)).toEqual([7, 7, 7, 7, 5, 5, 5, 5, 0, 0, 0, 0])
    expect(Array.from(b.maps.stokesPowerW.subarray(0, 4))).toEqual([14, 14, 14, 14])
    expect(Array.from(b.maps.acousticPhononsPerM.subarray(4, 8))).toEqual([15, 15, 15, 15])
    expect(Array.from(b.filled)).toEqual([1, 1, 1, 1, 0, 0])
    expect(b.rowsFilled).toBe(4)
  })

  it('drops what an older attempt left and the late blocks of that attempt', () => {
    const { ev, source } = setup()
    source.emit('status', { status: 'running', attempt: 1, error: null })
    source.emit('block', block(1, 0, 0, 2, 7))
    source.emit('block', block(1, 1, 2, 2, 7))
    const before = ev.mapVersion.value
    // The worker was lost; the run starts again from row 0 as attempt 2.
    source.emit('status', { status: 'running', attempt: 2, error: null })
    expect(ev.mapVersion.value).toBeGreaterThan(before)
    expect(ev.buffer.value.rowsFilled).toBe(0)
    source.emit('block', block(1, 2, 4, 2, 7)) // late, from attempt 1
    source.emit('progress', { attempt: 1, fraction: 0.9 })
    source.emit('block', block(2, 0, 0, 2, 3))
    expect(Array.from(ev.buffer.value.maps.pumpPowerW)).toEqual([3, 3, 3, 3, 0, 0, 0, 0, 0, 0, 0, 0])
    expect(ev.buffer.value.rowsFilled).toBe(2)
    expect(ev.progress.value).toBe(0)
    expect(ev.attempt.value).toBe(2)
  })

  it('grows the maps when a block lies beyond the expected rows', () => {
    const { ev, source } = setup()
    source.emit('block', block(1, 0, 0, 2, 1))
    source.emit('block', block(1, 3, 6, 2, 4))
    expect(ev.buffer.value.rows).toBe(8)
    expect(Array.from(ev.buffer.value.maps.pumpPowerW.subarray(0, 4))).toEqual([1, 1, 1, 1])
    expect(Array.from(ev.buffer.value.maps.pumpPowerW.subarray(12, 16))).toEqual([4, 4, 4, 4])
    expect(ev.buffer.value.rowsFilled).toBe(4)
  })

  it('closes the stream once the run is final', () => {
    const { ev, source } = setup()
    source.emit('status', { status: 'succeeded', attempt: 1, error: null })
    expect(ev.status.value).toBe('succeeded')
    expect(ev.progress.value).toBe(1)
    expect(source.closed).toBe(true)
    expect(ev.connection.value).toBe('closed')
  })
})
