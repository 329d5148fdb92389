import { onScopeDispose, ref, shallowRef, watch, type Ref } from 'vue'
import { FINAL_RUN_STATES, RunBlockEvent, RunProgressEvent, RunStatusEvent, type RunState } from '@shared/api/runs'
import { runEventsUrl } from '@/api/runs'
import { RunMapBuffer } from '@/components/run/run-map-buffer'

/** What the composable needs of an EventSource; tests hand in a fake. */
export interface EventSourceLike {
  addEventListener(type: string, listener: (e: MessageEvent) => void): void
  close(): void
  onerror: ((e: Event) => void) | null
  onopen: ((e: Event) => void) | null
  readonly readyState: number
}

export interface UseRunEventsOptions {
  /** Map size the run should produce, so the maps show their full extent from the first block. */
  expectedSize?: () => { rows: number; cols: number }
  createSource?: (url: string) => EventSourceLike
  share?: string
}

const defaultSource = (url: string): EventSourceLike => new EventSource(url, { withCredentials: true })
const CLOSED = 2

/**
 * Live status, progress and map blocks of one run over server-sent events. EventSource reconnects by itself
 * and sends Last-Event-ID, so the server resumes after the last event we saw; replays are harmless because
 * the buffer ignores blocks it already has and blocks of older attempts.
 */
export function useRunEvents(runId: Ref<string | null>, opts: UseRunEventsOptions = {}) {
  const status = ref<RunState | null>(null)
  const attempt = ref(0)
  const progress = ref(0)
  const error = ref<string | null>(null)
  /** 'live' while the stream is open, 'retrying' after a drop, 'closed' once the run is final or we stopped. */
  const connection = ref<'idle' | 'live' | 'retrying' | 'closed'>('idle')
  const freshBuffer = () => {
    const size = opts.expectedSize?.() ?? { rows: 0, cols: 0 }
    return new RunMapBuffer(size.rows, size.cols)
  }
  const buffer = shallowRef(freshBuffer())
  /** Bumped on every change to the buffer (its arrays change in place). */
  const mapVersion = ref(0)
  let source: EventSourceLike | null = null

  const parse = (e: MessageEvent): unknown => {
    try {
      return JSON.parse(String(e.data))
    } catch {
      return null
    }
  }

  function stop() {
    source?.close()
    source = null
    connection.value = 'closed'
  }

  /** A new run (or none) under the same page: nothing of the previous run's stream may show meanwhile. */
  function forget() {
    status.value = null
    attempt.value = 0
    progress.value = 0
    error.value = null
  }

  function start(id: string) {
    stop()
    forget()
    buffer.value = freshBuffer()
    mapVersion.value++
    const s = (opts.createSource ?? defaultSource)(runEventsUrl(id, opts.share))
    source = s
    connection.value = 'idle'
    s.onopen = () => (connection.value = 'live')
    s.onerror = () => {
      // readyState CLOSED: the server said there is nothing more (204) or refused; otherwise it retries.
      connection.value = s.readyState === CLOSED ? 'closed' : 'retrying'
    }
    s.addEventListener('status', (e) => {
      const p = RunStatusEvent.safeParse(parse(e))
      if (!p.success || p.data.attempt < attempt.value) return
      if (p.data.attempt > attempt.value) progress.value = 0
      attempt.value = p.data.attempt
      status.value = p.data.status
      error.value = p.data.error
      const before = buffer.value.attempt
      buffer.value.noteAttempt(p.data.attempt)
      if (buffer.value.attempt !== before) mapVersion.value++
      if (p.data.status === 'succeeded') progress.value = 1
      if (FINAL_RUN_STATES.includes(p.data.status)) stop()
    })
    s.addEventListener('progress', (e) => {
      const p = RunProgressEvent.safeParse(parse(e))
      if (!p.success || p.data.attempt < attempt.value) return
      attempt.value = p.data.attempt
      progress.value = p.data.fraction
    })
    s.addEventListener('block', (e) => {
      const p = RunBlockEvent.safeParse(parse(e))
      if (!p.success || p.data.attempt < attempt.value) return
      if (buffer.value.apply(p.data)) mapVersion.value++
    })
  }

  watch(runId, (id) => {
    if (id) return start(id)
    stop()
    forget()
  }, { immediate: true })
  onScopeDispose(stop)

  return { status, attempt, progress, error, connection, buffer, mapVersion, stop }
}
